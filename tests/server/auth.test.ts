import request from 'supertest';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { AuditEvent } from '../../server/db/entities/audit-event.entity';
import { agent, makeUser, sessionCount, startTestApp, truncateAll, type TestContext } from '../helpers/test-app';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx.close());
beforeEach(() => truncateAll(ctx.ds));

const problemShape = { status: expect.any(Number), title: expect.any(String), detail: expect.any(String), errors: expect.any(Array) };

describe('sign-in', () => {
  it('signs in with the right password, sets an httpOnly SameSite=Lax cookie and answers /api/me', async () => {
    const user = await makeUser(ctx.ds, ['engineer']);
    const ag = await agent(ctx);
    const res = await ag.signIn(user);
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: user.email, roles: ['engineer'] });
    const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('pw.sid='));
    expect(cookie).toBeDefined();
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i); // plain http in tests
    const me = await ag.a.get('/api/me').expect(200);
    expect(me.body.user.email).toBe(user.email);
    expect(await sessionCount(ctx.ds)).toBe(1);
    const events = await ctx.ds.getRepository(AuditEvent).findBy({ action: 'auth.sign-in' });
    expect(events.map((e) => e.actorEmail)).toEqual([user.email]);
  });

  it('marks the cookie Secure when served over https behind a trusted proxy', async () => {
    const secureCtx = await startTestApp({ TRUST_PROXY: 'true' });
    try {
      const user = await makeUser(secureCtx.ds, ['operator']);
      const a = request.agent(secureCtx.app);
      const t = await a.get('/api/auth/csrf').set('X-Forwarded-Proto', 'https');
      const res = await a.post('/api/auth/sign-in').set('X-Forwarded-Proto', 'https').set('X-CSRF-Token', t.body.token).send({ email: user.email, password: 'correct-horse-battery' });
      expect(res.status).toBe(200);
      const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('pw.sid='));
      expect(cookie).toMatch(/Secure/i);
    } finally {
      await secureCtx.close();
    }
  });

  it.each([
    ['a wrong password', async () => ({ email: (await makeUser(ctx.ds, ['engineer'])).email, password: 'not-the-password' })],
    ['an unknown user', async () => ({ email: 'nobody@test.example', password: 'whatever-it-is' })],
    ['a deactivated user', async () => ({ email: (await makeUser(ctx.ds, ['engineer'], { active: false })).email, password: 'correct-horse-battery' })],
  ])('refuses %s with 401, a problem body and no session', async (_label, make) => {
    const body = await make();
    const ag = await agent(ctx);
    const res = await ag.a.post('/api/auth/sign-in').set('X-CSRF-Token', ag.token).send(body);
    expect(res.status).toBe(401);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(res.body).toMatchObject(problemShape);
    expect(res.body.detail).toMatch(/e-mail or password/);
    expect(res.headers['set-cookie'] ?? []).not.toEqual(expect.arrayContaining([expect.stringMatching(/^pw\.sid=/)]));
    expect(await sessionCount(ctx.ds)).toBe(0);
    const failed = await ctx.ds.getRepository(AuditEvent).findBy({ action: 'auth.sign-in-failed' });
    expect(failed).toHaveLength(1);
  });

  it('refuses a request without a CSRF token with 403 and no session', async () => {
    const user = await makeUser(ctx.ds, ['engineer']);
    const res = await request(ctx.app).post('/api/auth/sign-in').send({ email: user.email, password: 'correct-horse-battery' });
    expect(res.status).toBe(403);
    expect(res.body).toMatchObject({ ...problemShape, title: 'Missing or invalid CSRF token' });
    expect(await sessionCount(ctx.ds)).toBe(0);
  });

  it('refuses a forged CSRF token', async () => {
    const user = await makeUser(ctx.ds, ['engineer']);
    const ag = await agent(ctx);
    const res = await ag.a.post('/api/auth/sign-in').set('X-CSRF-Token', ag.token.slice(0, -4) + 'abcd').send({ email: user.email, password: 'correct-horse-battery' });
    expect(res.status).toBe(403);
    expect(await sessionCount(ctx.ds)).toBe(0);
  });

  it('answers malformed JSON with 400 and says what is wrong', async () => {
    const ag = await agent(ctx);
    const res = await ag.a.post('/api/auth/sign-in').set('X-CSRF-Token', ag.token).set('Content-Type', 'application/json').send('{"email": "a@b.c", "password": ');
    expect(res.status).toBe(400);
    expect(res.body).toMatchObject({ ...problemShape, title: 'Malformed JSON' });
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.(ts|js):\d+/); // no stack trace
    expect(await sessionCount(ctx.ds)).toBe(0);
  });

  it('answers an oversized body with 413', async () => {
    const ag = await agent(ctx);
    const res = await ag.a.post('/api/auth/sign-in').set('X-CSRF-Token', ag.token).send({ email: 'a@b.c', password: 'x'.repeat(1_200_000) });
    expect(res.status).toBe(413);
    expect(res.body).toMatchObject({ ...problemShape, title: 'Body too large' });
    expect(res.body.detail).toBe('The request body is larger than the 1.0 MB limit.'); // express.json limit '1mb' = 1,048,576 bytes, in decimal units
    expect(await sessionCount(ctx.ds)).toBe(0);
  });

  it('names each invalid field', async () => {
    const ag = await agent(ctx);
    const res = await ag.a.post('/api/auth/sign-in').set('X-CSRF-Token', ag.token).send({ email: 'not-an-address', password: '' });
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['email', 'password']);
  });

  it('rate-limits sign-in attempts per address', async () => {
    const limited = await startTestApp({ LOGIN_RATE_LIMIT: '3' });
    try {
      const ag = await agent(limited);
      const statuses: number[] = [];
      for (let i = 0; i < 5; i++) {
        const r = await ag.a.post('/api/auth/sign-in').set('X-CSRF-Token', ag.token).send({ email: 'x@test.example', password: 'wrong-password' });
        statuses.push(r.status);
      }
      expect(statuses).toEqual([401, 401, 401, 429, 429]);
    } finally {
      await limited.close();
    }
  });

  it('signs out: the session row is gone and /api/me answers 401', async () => {
    const user = await makeUser(ctx.ds, ['operator']);
    const ag = await agent(ctx);
    await ag.signIn(user);
    expect(await sessionCount(ctx.ds)).toBe(1);
    await ag.a.post('/api/auth/sign-out').set('X-CSRF-Token', ag.token).expect(204);
    expect(await sessionCount(ctx.ds)).toBe(0);
    await ag.a.get('/api/me').expect(401);
  });

  it('sends security headers', async () => {
    const res = await request(ctx.app).get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toMatch(/default-src 'self'/);
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('reports the database round trip on /api/health', async () => {
    const res = await request(ctx.app).get('/api/health').expect(200);
    expect(res.body).toMatchObject({ status: 'ok', database: { ok: true } });
    expect(res.body.database.roundTripMs).toBeGreaterThan(0);
  });

  it('answers an unknown API route with a 404 problem body, not the page', async () => {
    const ag = await agent(ctx);
    const res = await ag.a.get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body).toMatchObject(problemShape);
  });
});
