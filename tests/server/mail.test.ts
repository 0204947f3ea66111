import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { signedInAgent, startTestApp, truncateAll, type TestContext } from '../helpers/test-app';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx.close());
beforeEach(() => truncateAll(ctx.ds));

describe('mail capture', () => {
  it('delivers through SMTP to the local capture server, which stores it for the Outbox', async () => {
    expect(ctx.mailer.capturePort).toBeGreaterThan(0);
    await ctx.mailer.send({ to: ['lena@test.example', 'lena@test.example'], subject: 'Proposal: QFN-24 4×4', text: 'A new package was proposed.\nOpen the library to decide.' });
    const admin = await signedInAgent(ctx, ['admin']);
    const res = await admin.a.get('/api/outbox').expect(200);
    expect(res.body.items).toHaveLength(1);
    const m = res.body.items[0];
    expect(m).toMatchObject({ subject: 'Proposal: QFN-24 4×4', to: ['lena@test.example'], transport: 'captured' });
    expect(m.text).toContain('Open the library to decide.');
    const one = await admin.a.get(`/api/outbox/${m.id}`).expect(200);
    expect(one.body.id).toBe(m.id);
  });

  it('sendQuietly never throws, even without recipients', async () => {
    await expect(ctx.mailer.sendQuietly({ to: [], subject: 'x', text: 'y' })).resolves.toBeUndefined();
  });
});
