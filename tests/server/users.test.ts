import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { AuditEvent } from '../../server/db/entities/audit-event.entity';
import { User } from '../../server/db/entities/user.entity';
import { agent, sessionCount, signedInAgent, startTestApp, truncateAll, type TestContext } from '../helpers/test-app';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
});
afterAll(() => ctx.close());
beforeEach(() => truncateAll(ctx.ds));

describe('users (admin)', () => {
  it('creates a user with a bcrypt hash of cost ≥ 10 who can then sign in', async () => {
    const admin = await signedInAgent(ctx, ['admin']);
    const res = await admin.a.post('/api/users').set('X-CSRF-Token', admin.token).send({ email: 'New.Person@Test.example', name: 'New Person', roles: ['engineer', 'librarian'], password: 'a-long-password' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email: 'new.person@test.example', roles: ['engineer', 'librarian'], active: true });
    const row = await ctx.ds.getRepository(User).findOneByOrFail({ email: 'new.person@test.example' });
    // OWASP Password Storage Cheat Sheet: bcrypt work factor of 10 or more.
    const cost = Number(row.passwordHash.split('$')[2]);
    expect(cost).toBeGreaterThanOrEqual(10);
    expect(row.passwordHash).not.toContain('a-long-password');
    const ag = await agent(ctx);
    const signIn = await ag.signIn(row, 'a-long-password');
    expect(signIn.status).toBe(200);
    const audit = await ctx.ds.getRepository(AuditEvent).findOneByOrFail({ action: 'user.create' });
    expect(audit).toMatchObject({ actorEmail: admin.user.email, target: 'new.person@test.example' });
  });

  it('refuses a duplicate e-mail with 409 naming the field', async () => {
    const admin = await signedInAgent(ctx, ['admin']);
    const body = { email: 'dup@test.example', name: 'Dup', roles: ['operator'], password: 'a-long-password' };
    await admin.a.post('/api/users').set('X-CSRF-Token', admin.token).send(body).expect(201);
    const res = await admin.a.post('/api/users').set('X-CSRF-Token', admin.token).send(body);
    expect(res.status).toBe(409);
    expect(res.body.errors).toEqual([{ path: 'email', message: 'Already in use' }]);
  });

  it('rejects a short password and no roles, field by field', async () => {
    const admin = await signedInAgent(ctx, ['admin']);
    const res = await admin.a.post('/api/users').set('X-CSRF-Token', admin.token).send({ email: 'x@test.example', name: 'X', roles: [], password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['password', 'roles']);
    expect(await ctx.ds.getRepository(User).countBy({ email: 'x@test.example' })).toBe(0);
  });

  it('changes roles with the version seen, audits before/after, and answers 409 to a stale version', async () => {
    const admin = await signedInAgent(ctx, ['admin']);
    const target = await signedInAgent(ctx, ['operator']);
    const first = await admin.a.patch(`/api/users/${target.user.id}`).set('X-CSRF-Token', admin.token).send({ roles: ['operator', 'engineer'], version: target.user.version });
    expect(first.status).toBe(200);
    expect(first.body.roles).toEqual(['engineer', 'operator']);
    expect(first.body.version).toBe(target.user.version + 1);
    const stale = await admin.a.patch(`/api/users/${target.user.id}`).set('X-CSRF-Token', admin.token).send({ roles: ['librarian'], version: target.user.version });
    expect(stale.status).toBe(409);
    expect(stale.body.detail).toMatch(/changed by someone else/);
    const row = await ctx.ds.getRepository(User).findOneByOrFail({ id: target.user.id });
    expect(row.roles.sort()).toEqual(['engineer', 'operator']); // the stale write lost nothing
    const ev = await ctx.ds.getRepository(AuditEvent).findOneByOrFail({ action: 'user.roles' });
    expect(ev.detail).toEqual({ before: ['operator'], after: ['engineer', 'operator'] });
  });

  it('deactivating a user ends their sessions', async () => {
    const admin = await signedInAgent(ctx, ['admin']);
    const target = await signedInAgent(ctx, ['engineer']);
    expect(await sessionCount(ctx.ds)).toBe(2);
    await admin.a.patch(`/api/users/${target.user.id}`).set('X-CSRF-Token', admin.token).send({ active: false, version: target.user.version }).expect(200);
    expect(await sessionCount(ctx.ds)).toBe(1);
    await target.a.get('/api/me').expect(401);
  });

  it('an admin cannot deactivate themselves', async () => {
    const admin = await signedInAgent(ctx, ['admin']);
    const res = await admin.a.patch(`/api/users/${admin.user.id}`).set('X-CSRF-Token', admin.token).send({ active: false, version: admin.user.version });
    expect(res.status).toBe(400);
  });

  it('resets a password: the old one stops working, the new one works', async () => {
    const admin = await signedInAgent(ctx, ['admin']);
    const target = await signedInAgent(ctx, ['librarian']);
    await admin.a.post(`/api/users/${target.user.id}/password`).set('X-CSRF-Token', admin.token).send({ password: 'brand-new-password' }).expect(204);
    await target.a.get('/api/me').expect(401);
    const fresh = await agent(ctx);
    expect((await fresh.signIn(target.user)).status).toBe(401);
    expect((await fresh.signIn(target.user, 'brand-new-password')).status).toBe(200);
  });

  it('a user changes their own password only with the current one', async () => {
    const me = await signedInAgent(ctx, ['operator']);
    const wrong = await me.a.post('/api/me/password').set('X-CSRF-Token', me.token).send({ currentPassword: 'nope', newPassword: 'another-long-one' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.errors[0].path).toBe('currentPassword');
    await me.a.post('/api/me/password').set('X-CSRF-Token', me.token).send({ currentPassword: 'correct-horse-battery', newPassword: 'another-long-one' }).expect(204);
  });
});

describe('audit log', () => {
  it('filters by action and actor, newest first', async () => {
    const admin = await signedInAgent(ctx, ['admin']);
    await signedInAgent(ctx, ['engineer']);
    const all = await admin.a.get('/api/audit').expect(200);
    expect(all.body.total).toBe(2);
    expect(all.body.items[0].actorEmail).toMatch(/engineer/);
    const onlyAdmin = await admin.a.get('/api/audit').query({ actor: 'admin' }).expect(200);
    expect(onlyAdmin.body.items).toHaveLength(1);
    const none = await admin.a.get('/api/audit').query({ action: 'user.create' }).expect(200);
    expect(none.body.total).toBe(0);
    const bad = await admin.a.get('/api/audit').query({ from: 'yesterday' });
    expect(bad.status).toBe(400);
    expect(bad.body.errors[0].path).toBe('query.from');
  });

  it('shows a user only their own recent activity', async () => {
    await signedInAgent(ctx, ['admin']);
    const eng = await signedInAgent(ctx, ['engineer']);
    const mine = await eng.a.get('/api/audit/mine').expect(200);
    expect(mine.body.items.every((e: { actorId: string }) => e.actorId === eng.user.id)).toBe(true);
    expect(mine.body.items).toHaveLength(1);
  });
});
