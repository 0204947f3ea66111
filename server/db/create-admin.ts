import { createInterface } from 'node:readline/promises';
import { passwordStrength } from '../../shared/password-strength';
import { createUserInputSchema } from '../../shared/schemas/auth.schema';
import { AuditService } from '../modules/audit/audit.service';
import { UserService } from '../modules/users/user.service';
import { createDataSource } from './data-source';

/**
 * `node --import tsx server/db/create-admin.ts EMAIL "NAME"` — creates the first admin of a
 * production install (where no demo users exist). The password is read from standard input.
 */
const [email, name] = process.argv.slice(2);
const url = process.env.DATABASE_URL;
if (!email || !name || !url) {
  console.error('usage: DATABASE_URL=postgres://… node --import tsx server/db/create-admin.ts EMAIL "NAME"  (password on stdin)');
  process.exit(2);
}
const rl = createInterface({ input: process.stdin, output: process.stderr, terminal: false });
const password = (await rl.question('Password (at least 10 characters, hard to guess: a few unrelated words work well): ')).trim();
rl.close();
const input = createUserInputSchema.safeParse({ email, name, roles: ['admin'], password });
if (!input.success) {
  for (const i of input.error.issues) console.error(`${i.path.join('.')}: ${i.message}`);
  process.exit(2);
}
const strength = passwordStrength(input.data.password, [input.data.email, input.data.name]);
if (!strength.ok) {
  console.error(`password: ${strength.message}`);
  process.exit(2);
}
const ds = createDataSource(url);
await ds.initialize();
const audit = new AuditService(ds);
const user = await new UserService(ds, audit).create(input.data, null);
console.error(`created admin ${user.email}`);
await ds.destroy();
