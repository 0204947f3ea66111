import 'reflect-metadata';
import bcrypt from 'bcryptjs';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { inject } from 'vitest';
import { createApp } from '../../server/app';
import { loadEnv, type Env } from '../../server/config/env';
import { createDataSource } from '../../server/db/data-source';
import { User } from '../../server/db/entities/user.entity';
import { Mailer } from '../../server/modules/mail/mailer';
import type { Role } from '../../shared/schemas/auth.schema';

export const TEST_PASSWORD = 'correct-horse-battery';
// A cheap hash for test users (cost 4); the service itself hashes with BCRYPT_COST.
const TEST_HASH = bcrypt.hashSync(TEST_PASSWORD, 4);

export interface TestContext {
  ds: DataSource;
  app: ReturnType<typeof createApp>;
  mailer: Mailer;
  env: Env;
  close(): Promise<void>;
}

export async function startTestApp(overrides: Partial<Record<string, string>> = {}): Promise<TestContext> {
  const url = inject('databaseUrl');
  const env = loadEnv({ NODE_ENV: 'test', DATABASE_URL: url, SMTP_CAPTURE_PORT: '0', LOGIN_RATE_LIMIT: '1000', ...overrides });
  const ds = createDataSource(url);
  await ds.initialize();
  const mailer = new Mailer(ds, { capturePort: 0, from: env.MAIL_FROM });
  await mailer.start();
  const app = createApp({ ds, env, mailer });
  return {
    ds,
    app,
    mailer,
    env,
    async close() {
      await app.locals.services.checks.close();
      await mailer.stop();
      await ds.destroy();
    },
  };
}

/** Empties every table but the migrations' own (new tables need no edit here). */
export async function truncateAll(ds: DataSource) {
  const rows: { tablename: string }[] = await ds.query(`SELECT tablename FROM pg_tables WHERE schemaname = 'public' AND tablename <> 'migrations'`);
  if (rows.length === 0) return;
  await ds.query(`TRUNCATE TABLE ${rows.map((r) => `"${r.tablename}"`).join(', ')} RESTART IDENTITY CASCADE`);
}

let counter = 0;
export async function makeUser(ds: DataSource, roles: Role[], over: Partial<User> = {}): Promise<User> {
  counter += 1;
  const repo = ds.getRepository(User);
  return repo.save(
    repo.create({ email: `user${counter}-${roles.join('-') || 'none'}@test.example`, name: `Test ${roles.join('/')} ${counter}`, roles, passwordHash: TEST_HASH, active: true, ...over }),
  );
}

/** The app in this process, or the base URL of a server process (the browser tests'). */
export type AgentTarget = { ds: DataSource; app: TestContext['app'] | string };

/** A supertest agent with a CSRF token; `signIn` logs it in. */
export async function agent(ctx: Pick<AgentTarget, 'app'>) {
  const a = request.agent(ctx.app);
  const tokenRes = await a.get('/api/auth/csrf').expect(200);
  let token: string = tokenRes.body.token;
  return {
    a,
    get token() {
      return token;
    },
    async signIn(user: User, password = TEST_PASSWORD) {
      const res = await a.post('/api/auth/sign-in').set('X-CSRF-Token', token).send({ email: user.email, password });
      if (res.status === 200) token = res.body.csrfToken;
      return res;
    },
  };
}

export async function signedInAgent(ctx: AgentTarget, roles: Role[]) {
  const user = await makeUser(ctx.ds, roles);
  const ag = await agent(ctx);
  const res = await ag.signIn(user);
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { ...ag, user };
}

export async function sessionCount(ds: DataSource): Promise<number> {
  const [{ n }] = await ds.query('SELECT count(*)::int AS n FROM "session"');
  return n;
}
