import { createDataSource } from './data-source';
import { seedDemo } from './seed/index';

/** `node --import tsx server/db/seed.ts` — seeds the demo scenario into DATABASE_URL. */
const url = process.env.DATABASE_URL;
if (!url) {
  console.error('DATABASE_URL is not set');
  process.exit(2);
}
const ds = createDataSource(url);
await ds.initialize();
await seedDemo(ds, (s) => console.error(`[placewright] ${s}`));
await ds.destroy();
