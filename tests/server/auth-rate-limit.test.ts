import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { agent, startTestApp, truncateAll, type TestContext } from '../helpers/test-app';

/**
 * Issue "Reliability and scale", defect 10: the sign-in limiter counts in PostgreSQL, so a restart
 * does not reset it and two instances on one database share it.
 */
let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx.close());
beforeEach(() => truncateAll(ctx.ds));

async function attempt(app: TestContext) {
  const ag = await agent(app);
  const res = await ag.a.post('/api/auth/sign-in').set('X-CSRF-Token', ag.token).send({ email: 'x@test.example', password: 'wrong-password' });
  return res.status;
}

describe('sign-in rate limit in PostgreSQL', () => {
  it('a restarted instance keeps counting where the old one stopped', async () => {
    const first = await startTestApp({ LOGIN_RATE_LIMIT: '3' });
    const before = [await attempt(first), await attempt(first)];
    await first.close();
    const second = await startTestApp({ LOGIN_RATE_LIMIT: '3' });
    try {
      const after = [await attempt(second), await attempt(second)];
      expect([...before, ...after]).toEqual([401, 401, 401, 429]);
    } finally {
      await second.close();
    }
  });

  it('two instances running at once share one count', async () => {
    const a = await startTestApp({ LOGIN_RATE_LIMIT: '4' });
    const b = await startTestApp({ LOGIN_RATE_LIMIT: '4' });
    try {
      const statuses = [await attempt(a), await attempt(b), await attempt(a), await attempt(b), await attempt(a), await attempt(b)];
      expect(statuses).toEqual([401, 401, 401, 401, 429, 429]);
      const [{ hits }] = await ctx.ds.query(`SELECT sum(hits)::int AS hits FROM rate_limit_hits`);
      expect(hits).toBe(6);
    } finally {
      await a.close();
      await b.close();
    }
  });

  it('answers 429 with a Retry-After and a problem body that says how long to wait', async () => {
    const a = await startTestApp({ LOGIN_RATE_LIMIT: '1' });
    try {
      await attempt(a);
      const ag = await agent(a);
      const res = await ag.a.post('/api/auth/sign-in').set('X-CSRF-Token', ag.token).send({ email: 'x@test.example', password: 'wrong-password' });
      expect(res.status).toBe(429);
      expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
      expect(res.body.detail).toMatch(/15 minutes/);
    } finally {
      await a.close();
    }
  });
});
