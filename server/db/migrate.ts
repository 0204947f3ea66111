import { createDataSource } from './data-source';

/** Runs pending migrations on DATABASE_URL; used by the start and test scripts. */
const url = process.env.DATABASE_URL;
if (!url) {
  console.error('DATABASE_URL is not set');
  process.exit(2);
}
const ds = createDataSource(url);
await ds.initialize();
const done = await ds.runMigrations({ transaction: 'each' });
for (const m of done) console.error(`[placewright] migrated ${m.name}`);
await ds.destroy();
