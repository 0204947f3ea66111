import pg from 'pg';
import { demoSeedMode, isNewDatabase, type DemoSeedMode } from './seed/when';

/**
 * `node --import tsx server/db/seed.ts` — seeds the demo scenario into DATABASE_URL when the
 * database is new (PW_DEMO_SEED unset or 1), always with PW_DEMO_SEED=force or `--force`, never
 * with PW_DEMO_SEED=0. `npm start` runs it after migrating; on a database that is not new it
 * only asks (one query, without loading TypeORM or the engine), so a restart is not slowed down.
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
if (mode === 'if-new') {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  const isNew = await isNewDatabase(async (q, params) => (await client.query(q, params)).rows);
  await client.end();
  if (!isNew) {
    log('the database is not new: the demo seed was skipped (PW_DEMO_SEED=force seeds it again; PW_DEMO_SEED=0 never seeds)');
    process.exit(0);
  }
}
log(mode === 'force' ? 'seeding the demo scenario (asked for)' : 'a new database: seeding the demo scenario (PW_DEMO_SEED=0 skips it)');
const { createDataSource } = await import('./data-source');
const { seedDemoIfNew } = await import('./seed/index');
const ds = createDataSource(url);
await ds.initialize();
await seedDemoIfNew(ds, mode, log);
await ds.destroy();
