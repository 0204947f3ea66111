import bcrypt from 'bcryptjs';
import type { DataSource } from 'typeorm';
import { User } from '../entities/user.entity';
import { BCRYPT_COST } from '../../modules/users/user.service';
import { DEMO_PASSWORD, DEMO_USERS } from './demo-users';
import { seedStarterLibrary } from './starter-library';
import { seedDemoPrograms } from './demo-programs';

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
