import { Platform1796183457559 } from './1796183457559-Platform';
import { Library1796184383882 } from './1796184383882-Library';
import { Programs1796184636392 } from './1796184636392-Programs';
import { WaiverScope1796185212011 } from './1796185212011-WaiverScope';
import { Reliability1796201900000 } from './1796201900000-Reliability';

/** Every migration, in order. Add a new one here after `npm run migration:generate -- server/db/migrations/Name`. */
export const migrations = [Platform1796183457559, Library1796184383882, Programs1796184636392, WaiverScope1796185212011, Reliability1796201900000];
