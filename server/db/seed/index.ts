import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import { User } from '../entities/user.entity';
import { BCRYPT_COST } from '../../modules/users/user.service';
import { DEMO_PASSWORD, DEMO_USERS } from './demo-users';
import { seedStarterLibrary } from './starter-library';
import { seedDemoPrograms } from './demo-programs';
import { isNewDatabase, markSeeded, type DemoSeedMode } from './when';

/** Idempotent: creates what is missing, leaves what exists (a changed password stays changed). */
export async function seedDemo(ds: DataSource, log: (s: string) => void = () => {}, opts: { programs?: boolean } = {}): Promise<void> {
  const repo = ds.getRepository(User);
  const hash = await bcrypt.hash(DEMO_PASSWORD, BCRYPT_COST);
  for (const u of DEMO_USERS) {
    const existing = await repo.findOneBy({ email: u.email });
    if (existing) continue;
    await repo.save(repo.create({ ...u, passwordHash: hash, active: true }));
    log(`created demo user ${u.email}`);
  }
  await seedStarterLibrary(ds, log);
  // The demo programs (one released, one in review); browser tests start without them.
  if (opts.programs !== false) await seedDemoPrograms(ds, log);
}

export { demoSeedMode, type DemoSeedMode } from './when';

/**
 * Seeds the demo when the database is new — no user yet, and the seed never ran on it — or when
 * `mode` is 'force'. A restart of a seeded or real database does not seed again (what was removed
 * stays removed). Records when it ran in app_state.
 */
export async function seedDemoIfNew(ds: DataSource, mode: DemoSeedMode, log: (s: string) => void = () => {}, opts: { programs?: boolean } = {}): Promise<'seeded' | 'skipped'> {
  if (mode === 'off') return 'skipped';
  const sql = (q: string, params?: unknown[]) => ds.query(q, params);
  if (mode === 'if-new' && !(await isNewDatabase(sql))) return 'skipped';
  await seedDemo(ds, log, opts);
  await markSeeded(sql, mode, opts.programs !== false);
  return 'seeded';
}
