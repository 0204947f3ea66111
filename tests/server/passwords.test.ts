import { spawnSync } from 'node:child_process';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import { User } from '../../server/db/entities/user.entity';
import { agent, sessionCount, signedInAgent, startTestApp, truncateAll, type TestContext } from '../helpers/test-app';

/** Issue "Reliability and scale", defect 9: password strength, and a change ends other sessions. */
let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx.close());
beforeEach(() => truncateAll(ctx.ds));

// Long enough for the length rule, but among the first guesses of any cracker (zxcvbn scores them 0 or 1).
const WEAK = ['          ', '1111111111', 'password123', 'qwertyuiop', 'abcdefghij'];
// A passphrase of four unrelated words (zxcvbn scores it 4).
const STRONG = 'tidal-lantern-quarry-58';

describe('password strength', () => {
  it.each(WEAK)('refuses %j when an admin creates a user, with a helpful message', async (password) => {
    const admin = await signedInAgent(ctx, ['admin']);
    const res = await admin.a.post('/api/users').set('X-CSRF-Token', admin.token).send({ email: 'weak@test.example', name: 'Weak Password', roles: ['operator'], password });
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.errors.map((e: { path: string }) => e.path)).toEqual(['password']);
    expect(res.body.detail).toMatch(/too easy to guess/);
    expect(res.body.errors[0].message).toMatch(/words|uncommon|avoid|add/i);
    expect(await ctx.ds.getRepository(User).countBy({ email: 'weak@test.example' })).toBe(0);
  });

  it('refuses a password built from the user’s own e-mail and name', async () => {
    const admin = await signedInAgent(ctx, ['admin']);
    const res = await admin.a.post('/api/users').set('X-CSRF-Token', admin.token).send({ email: 'wilhelmina.fairweather@test.example', name: 'Wilhelmina Fairweather', roles: ['operator'], password: 'WilhelminaFairweather' });
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.errors[0].path).toBe('password');
  });

  it('accepts a strong passphrase', async () => {
    const admin = await signedInAgent(ctx, ['admin']);
    const res = await admin.a.post('/api/users').set('X-CSRF-Token', admin.token).send({ email: 'strong@test.example', name: 'Strong Password', roles: ['operator'], password: STRONG });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
  });

  it('refuses a weak password on an admin reset and on one’s own change', async () => {
    const admin = await signedInAgent(ctx, ['admin']);
    const target = await signedInAgent(ctx, ['engineer']);
    const reset = await admin.a.post(`/api/users/${target.user.id}/password`).set('X-CSRF-Token', admin.token).send({ password: '1111111111' });
    expect(reset.status).toBe(400);
    expect(reset.body.errors[0].path).toBe('password');
    const own = await target.a.post('/api/me/password').set('X-CSRF-Token', target.token).send({ currentPassword: 'correct-horse-battery', newPassword: '          ' });
    expect(own.status).toBe(400);
    expect(own.body.errors[0].path).toBe('newPassword');
    expect(own.body.detail).toMatch(/too easy to guess/);
  });

  it('create-admin refuses a weak password and accepts a strong one', () => {
    const run = (password: string, email: string) =>
      spawnSync(process.execPath, ['--import', 'tsx', 'server/db/create-admin.ts', email, 'First Admin'], {
        input: password + '\n',
        encoding: 'utf8',
        env: { ...process.env, DATABASE_URL: inject('databaseUrl') },
        timeout: 60000,
      });
    const weak = run('1111111111', 'first.admin@test.example');
    expect(weak.status).toBe(2);
    expect(weak.stderr).toMatch(/too easy to guess/);
    const strong = run(STRONG, 'first.admin@test.example');
    expect(strong.status, strong.stderr).toBe(0);
  });
});

describe('a password change ends the user’s other sessions', () => {
  it('changing one’s own password signs out the other browsers but keeps this one', async () => {
    const me = await signedInAgent(ctx, ['engineer']);
    const laptop = await agent(ctx);
    expect((await laptop.signIn(me.user)).status).toBe(200);
    const other = await signedInAgent(ctx, ['engineer']);
    expect(await sessionCount(ctx.ds)).toBe(3);
    await me.a.post('/api/me/password').set('X-CSRF-Token', me.token).send({ currentPassword: 'correct-horse-battery', newPassword: STRONG }).expect(204);
    await me.a.get('/api/me').expect(200);
    await laptop.a.get('/api/me').expect(401);
    await other.a.get('/api/me').expect(200);
    expect(await sessionCount(ctx.ds)).toBe(2);
  });
});
