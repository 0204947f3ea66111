import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../shared/schemas/auth.schema';
import type { Access } from '../../server/lib/routes';
import { signedInAgent, startTestApp, truncateAll, type TestContext } from '../helpers/test-app';

/**
 * Every API route, and who may call it. A route added to the server without a line here fails
 * the first test; a line left here after its route is gone fails it too.
 */
const EXPECTED: Record<string, Access> = {
  'GET /health': 'public',
  'GET /auth/csrf': 'public',
  'POST /auth/sign-in': 'public',
  'POST /auth/sign-out': 'signed-in',
  'GET /me': 'signed-in',
  'GET /users': ['admin'],
  'POST /users': ['admin'],
  'GET /users/:id': ['admin'],
  'PATCH /users/:id': ['admin'],
  'POST /users/:id/password': ['admin'],
  'POST /me/password': 'signed-in',
  'GET /audit': ['admin'],
  'GET /audit/mine': 'signed-in',
  'GET /outbox': ['admin'],
  'GET /outbox/:id': ['admin'],
  // Package library: engineers and librarians read (operators get what they need from the run
  // files and the set-up sheet); librarians edit; engineers propose.
  'GET /library/packages': ['engineer', 'librarian'],
  'POST /library/packages': ['librarian'],
  'GET /library/packages/:id': ['engineer', 'librarian'],
  'GET /library/packages/:id/usage': ['librarian', 'engineer'],
  'PUT /library/packages/:id': ['librarian'],
  'DELETE /library/packages/:id': ['librarian'],
  'POST /library/packages/csv/preview': ['librarian'],
  'POST /library/packages/csv': ['librarian'],
  'GET /library/aliases': ['engineer', 'librarian'],
  'POST /library/aliases': ['librarian'],
  'PUT /library/aliases/:id': ['librarian'],
  'DELETE /library/aliases/:id': ['librarian'],
  'GET /library/nozzles': ['engineer', 'librarian'],
  'POST /library/nozzles': ['librarian'],
  'PUT /library/nozzles/:id': ['librarian'],
  'DELETE /library/nozzles/:id': ['librarian'],
  'GET /library/vision-presets': ['engineer', 'librarian'],
  'POST /library/vision-presets': ['librarian'],
  'PUT /library/vision-presets/:id': ['librarian'],
  'DELETE /library/vision-presets/:id': ['librarian'],
  'GET /library/machines': ['engineer', 'librarian'],
  'POST /library/machines': ['librarian'],
  'PUT /library/machines/:id': ['librarian'],
  'DELETE /library/machines/:id': ['librarian'],
  'GET /library/revisions': ['engineer', 'librarian'],
  'GET /library/match': ['engineer', 'librarian'],
  'GET /library/file': ['engineer', 'librarian'],
  'GET /library/export': ['engineer', 'librarian'],
  'POST /library/import': ['librarian'],
  'GET /library/proposals': ['engineer', 'librarian'],
  'POST /library/proposals': ['engineer', 'librarian'],
  'POST /library/proposals/:id/approve': ['librarian'],
  'POST /library/proposals/:id/reject': ['librarian'],
  'GET /library/unmatched': ['engineer', 'librarian'],
  'POST /library/unmatched/:id/create-package': ['librarian'],
  'POST /library/unmatched/:id/add-alias': ['librarian'],
  // Programs, revisions, run files, tokens (issue 7).
  'GET /programs': ['engineer'],
  'POST /programs': ['engineer'],
  'GET /programs/:id': ['engineer'],
  'POST /programs/:id/revisions': ['engineer'],
  'GET /revisions/:id': ['engineer'],
  'POST /revisions/:id/centroid/preview': ['engineer'],
  'POST /revisions/:id/centroid': ['engineer'],
  'PUT /revisions/:id/settings': ['engineer'],
  'PUT /revisions/:id/overrides': ['engineer'],
  'GET /revisions/:id/run': ['engineer'],
  'POST /revisions/:id/checks': ['engineer'],
  'POST /revisions/:id/waivers': ['engineer'],
  'GET /revisions/:id/review-summary': ['engineer'],
  'DELETE /revisions/:id/waivers/:waiverId': ['engineer'],
  'POST /revisions/:id/submit': ['engineer'],
  'POST /revisions/:id/approve': ['engineer'],
  'POST /revisions/:id/reject': ['engineer'],
  'POST /revisions/:id/withdraw': ['engineer'],
  'POST /revisions/:id/comments': ['engineer'],
  'GET /revisions/:id/underlay': ['engineer'],
  'PUT /revisions/:id/underlay': ['engineer'],
  'GET /run-files': ['operator', 'engineer'],
  'GET /run-files/:id/setup-sheet': ['operator', 'engineer'],
  'GET /run-files/:id/:file': ['operator', 'engineer', 'line-token'],
  'POST /run-files/:id/problems': ['operator', 'engineer'],
  'GET /tokens': ['engineer'],
  'POST /tokens': ['engineer'],
  'DELETE /tokens/:id': ['engineer'],
  'GET /openapi.json': 'public',
};

const WHO: (Role | 'nobody')[] = ['nobody', 'admin', 'engineer', 'librarian', 'operator'];

function allowed(access: Access, who: Role | 'nobody'): boolean {
  if (access === 'public') return true;
  if (who === 'nobody') return false;
  if (access === 'signed-in' || who === 'admin') return true;
  return access.includes(who);
}

let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp();
  await truncateAll(ctx.ds);
});
afterAll(() => ctx.close());

describe('route × role table', () => {
  it('lists exactly the registered routes, with the same access', () => {
    const registered = Object.fromEntries(ctx.app.locals.routes.map((r) => [`${r.method} ${r.path}`, r.access]));
    expect(Object.keys(registered).sort()).toEqual(Object.keys(EXPECTED).sort());
    for (const [key, access] of Object.entries(EXPECTED)) expect(registered[key], key).toEqual(access);
  });

  const cases = Object.entries(EXPECTED).flatMap(([key, access]) => WHO.map((who) => [key, who, access] as const));

  it.each(cases)('%s as %s', async (key, who, access) => {
    const [method, pattern] = key.split(' ');
    const path = '/api' + pattern.replace(/:(id|waiverId)\b/g, '00000000-0000-4000-8000-000000000000').replace(/:file\b/, 'top.csv');
    let res: request.Response;
    if (who === 'nobody') {
      const a = request.agent(ctx.app);
      const token = (await a.get('/api/auth/csrf')).body.token as string;
      res = await a[method.toLowerCase() as 'get'](path).set('X-CSRF-Token', token).send(method === 'GET' ? undefined : {});
    } else {
      const ag = await signedInAgent(ctx, [who]);
      res = await ag.a[method.toLowerCase() as 'get'](path).set('X-CSRF-Token', ag.token).send(method === 'GET' ? undefined : {});
    }
    if (allowed(access, who)) {
      expect([401, 403], `${key} as ${who}: ${res.status} ${JSON.stringify(res.body)}`).not.toContain(res.status);
    } else {
      expect(res.status, `${key} as ${who}`).toBe(who === 'nobody' ? 401 : 403);
      expect(res.body.title).toBeTruthy();
    }
  });
});
