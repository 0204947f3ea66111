import { createDataSource } from './data-source';
import { demoSeedMode, isNewDatabase, type DemoSeedMode } from './seed/when';

/**
 * `node --import tsx server/db/seed.ts` — seeds the demo scenario into DATABASE_URL when the
 * database is new (PW_DEMO_SEED unset or 1), always with PW_DEMO_SEED=force or `--force`, never
 * with PW_DEMO_SEED=0. `npm start` runs it after migrating; on a database that is not new it
 * only asks, so a restart is not slowed down.
 */
const url = process.env.DATABASE_URL;
if (!url) {
  console.error('DATABASE_URL is not set');
  process.exit(2);
}
let mode: DemoSeedMode;
try {
  mode = process.argv.includes('--force') ? 'force' : demoSeedMode(process.env.PW_DEMO_SEED);
} catch (err) {
  console.error(`[placewright] ${(err as Error).message}`);
  process.exit(2);
}
if (mode === 'off') process.exit(0);
const log = (s: string) => console.error(`[placewright] ${s}`);
const ds = createDataSource(url);
await ds.initialize();
if (mode === 'if-new' && !(await isNewDatabase(ds))) {
  log('the database is not new: the demo seed was skipped (PW_DEMO_SEED=force seeds it again; PW_DEMO_SEED=0 never seeds)');
} else {
  log(mode === 'force' ? 'seeding the demo scenario (asked for)' : 'a new database: seeding the demo scenario (PW_DEMO_SEED=0 skips it)');
  const { seedDemoIfNew } = await import('./seed/index');
  await seedDemoIfNew(ds, mode, log);
}
await ds.destroy();
