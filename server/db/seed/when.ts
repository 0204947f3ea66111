// When the demo seed runs. Light on purpose (no TypeORM, no engine): a restart only asks.

/** Runs one SQL statement: a TypeORM DataSource's `query`, or a plain node-postgres client's. */
export type Sql = (sql: string, params?: unknown[]) => Promise<Record<string, unknown>[]>;

export type DemoSeedMode = 'off' | 'if-new' | 'force';

/** PW_DEMO_SEED: `0` never seeds, `1` (the default) seeds a new database, `force` seeds every start. */
export function demoSeedMode(value: string | undefined): DemoSeedMode {
  const v = (value ?? '1').trim().toLowerCase();
  if (v === '0' || v === 'false' || v === 'no') return 'off';
  if (v === '1' || v === '' || v === 'true' || v === 'yes') return 'if-new';
  if (v === 'force') return 'force';
  throw new Error(`PW_DEMO_SEED is "${value}"; use 0, 1 or force (0: never seed, 1: seed a new database, force: seed now).`);
}

const MARKER = 'demo-seed';

/** New: the seed never ran on it and it has no user (a real site has at least its admin). */
export async function isNewDatabase(sql: Sql): Promise<boolean> {
  const [{ marked, users }] = await sql(
    `SELECT EXISTS (SELECT 1 FROM "app_state" WHERE "key" = $1) AS marked, EXISTS (SELECT 1 FROM "users") AS users`,
    [MARKER],
  );
  return !marked && !users;
}

/** Records in app_state that (and how) the demo seed ran. */
export async function markSeeded(sql: Sql, mode: DemoSeedMode, programs: boolean): Promise<void> {
  await sql(
    `INSERT INTO "app_state" ("key", "value") VALUES ($1, $2) ON CONFLICT ("key") DO UPDATE SET "value" = EXCLUDED."value", "updated_at" = now()`,
    [MARKER, JSON.stringify({ at: new Date().toISOString(), mode, programs })],
  );
}
