import { Platform1796183457559 } from './1796183457559-Platform';

/** Every migration, in order. Add a new one here after `npm run migration:generate -- server/db/migrations/Name`. */
export const migrations = [Platform1796183457559];
// Package library (issue 4).
import { Library1796184383882 } from './1796184383882-Library';
(migrations as unknown[]).push(Library1796184383882);
// Programs, revisions and run files (issue 7).
import { Programs1796184636392 } from './1796184636392-Programs';
(migrations as unknown[]).push(Programs1796184636392);
