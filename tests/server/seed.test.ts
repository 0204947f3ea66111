import { spawnSync } from 'node:child_process';
import { afterAll, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest';
import { User } from '../../server/db/entities/user.entity';
import { demoSeedMode, seedDemoIfNew } from '../../server/db/seed/index';
import { makeUser, startTestApp, truncateAll, type TestContext } from '../helpers/test-app';

/** Issue "Reliability and scale", defect 11: the demo seed runs when the database is new, or when asked. */
let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx.close());
beforeEach(() => truncateAll(ctx.ds));

const users = () => ctx.ds.getRepository(User).count();

describe('demo seed only on a new database', () => {
  it('seeds a new database once; a restart leaves it alone, even after a demo user was removed', async () => {
    expect(await seedDemoIfNew(ctx.ds, 'if-new', () => {}, { programs: false })).toBe('seeded');
    const seeded = await users();
    expect(seeded).toBe(5);
    const [marker] = await ctx.ds.query(`SELECT value FROM app_state WHERE key = 'demo-seed'`);
    expect(marker.value.at).toMatch(/^\d{4}-\d\d-\d\dT/);

    await ctx.ds.getRepository(User).delete({ email: 'otto@harrowcreek.example' });
    expect(await seedDemoIfNew(ctx.ds, 'if-new', () => {}, { programs: false })).toBe('skipped');
    expect(await users()).toBe(seeded - 1);

    // asked explicitly: the seed runs again and puts back what is missing
    expect(await seedDemoIfNew(ctx.ds, 'force', () => {}, { programs: false })).toBe('seeded');
    expect(await users()).toBe(seeded);
  });

  it('a database that already has users (seeded before, or a real site) is not new', async () => {
    await makeUser(ctx.ds, ['admin']);
    expect(await seedDemoIfNew(ctx.ds, 'if-new', () => {}, { programs: false })).toBe('skipped');
    expect(await users()).toBe(1);
  });

  it('PW_DEMO_SEED: 0 never, 1 (the default) when new, force always; anything else is an error', () => {
    expect(demoSeedMode(undefined)).toBe('if-new');
    expect(demoSeedMode('1')).toBe('if-new');
    expect(demoSeedMode('0')).toBe('off');
    expect(demoSeedMode('force')).toBe('force');
    expect(() => demoSeedMode('sometimes')).toThrow(/PW_DEMO_SEED.*0, 1 or force/);
  });

  it('the seed command skips a database that is not new, quickly and saying so', async () => {
    await makeUser(ctx.ds, ['admin']);
    const t0 = Date.now();
    const r = spawnSync(process.execPath, ['--import', 'tsx', 'server/db/seed.ts'], { encoding: 'utf8', env: { ...process.env, DATABASE_URL: inject('databaseUrl'), PW_DEMO_SEED: '1' }, timeout: 60000 });
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toMatch(/not new.*PW_DEMO_SEED=force/);
    expect(await users()).toBe(1);
    // no bcrypt, no checks: a restart is not slowed by the seed (a loose bound for a shared machine)
    expect(Date.now() - t0).toBeLessThan(20000);
  });
});
