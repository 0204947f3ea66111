import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { startTestApp, type TestContext } from '../helpers/test-app';

type Json = Record<string, any>;

let ctx: TestContext;
let doc: Json;
beforeAll(async () => {
  ctx = await startTestApp();
  const res = await request(ctx.app).get('/api/openapi.json');
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toMatch(/application\/json/);
  doc = res.body;
});
afterAll(async () => {
  await ctx.app.locals.services.checks.close();
  await ctx.close();
});

const METHODS = ['get', 'put', 'post', 'delete', 'options', 'head', 'patch', 'trace'];
const toOpenApi = (p: string) => p.replace(/:(\w+)/g, '{$1}');
const op = (method: string, path: string) => doc.paths[toOpenApi(path)]?.[method.toLowerCase()];

describe('GET /api/openapi.json', () => {
  // Shape checks follow the OpenAPI Specification 3.1.0 (spec.openapis.org/oas/v3.1.0):
  // required root fields `openapi` and `info` (title, version); path keys begin with "/";
  // every path-template variable is a parameter with `in: path, required: true`;
  // every operation has `responses`, with status codes, ranges like 2XX, or `default`.
  it('is an OpenAPI 3.1 document in shape', () => {
    expect(doc.openapi).toMatch(/^3\.1\.\d+$/);
    expect(typeof doc.info.title).toBe('string');
    expect(typeof doc.info.version).toBe('string');
    expect(doc.servers).toEqual([{ url: '/api' }]);
    const opIds = new Set<string>();
    for (const [path, item] of Object.entries<Json>(doc.paths)) {
      expect(path.startsWith('/'), path).toBe(true);
      expect(path, 'express-style :params must be {params}').not.toMatch(/:\w/);
      for (const [method, o] of Object.entries<Json>(item)) {
        expect(METHODS, `${method} ${path}`).toContain(method);
        expect(typeof o.operationId).toBe('string');
        expect(opIds.has(o.operationId), `duplicate operationId ${o.operationId}`).toBe(false);
        opIds.add(o.operationId);
        const vars = [...path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]);
        const declared = (o.parameters ?? []).filter((p: Json) => p.in === 'path');
        expect(declared.map((p: Json) => p.name).sort(), `${method} ${path}`).toEqual([...vars].sort());
        for (const p of declared) expect(p.required).toBe(true);
        expect(Object.keys(o.responses).length).toBeGreaterThan(0);
        for (const code of Object.keys(o.responses)) expect(code).toMatch(/^([1-5](\d\d|XX)|default)$/);
        for (const s of o.security ?? []) for (const name of Object.keys(s)) expect(doc.components.securitySchemes[name], name).toBeDefined();
      }
    }
  });

  it('lists every route registered on ApiRoutes, with its access', () => {
    const registered = ctx.app.locals.routes.map((r) => `${r.method} ${toOpenApi(r.path)}`).sort();
    const listed = Object.entries<Json>(doc.paths)
      .flatMap(([path, item]) => Object.keys(item).map((m) => `${m.toUpperCase()} ${path}`))
      .sort();
    expect(listed).toEqual(registered);
    expect(registered.length).toBeGreaterThan(60);
    for (const r of ctx.app.locals.routes) expect(op(r.method, r.path)['x-placewright-access'], `${r.method} ${r.path}`).toEqual(r.access);
  });

  it('names how each route is reached: public, session (+ CSRF on changes) or a line token', () => {
    expect(op('GET', '/health').security).toEqual([]);
    expect(op('POST', '/auth/sign-in').security).toEqual([{ csrfHeader: [] }]);
    expect(op('GET', '/run-files').security).toEqual([{ sessionCookie: [] }]);
    expect(op('POST', '/tokens').security).toEqual([{ sessionCookie: [], csrfHeader: [] }]);
    expect(op('GET', '/run-files/:id/:file').security).toEqual([{ sessionCookie: [] }, { lineToken: [] }]);
    expect(op('GET', '/run-files/:id/:file').description).toMatch(/Authorization: Bearer <token>/);
    expect(op('GET', '/tokens').description).toMatch(/engineer role/);
    expect(doc.components.securitySchemes.lineToken).toMatchObject({ type: 'http', scheme: 'bearer' });
  });

  it('carries the request schemas validate() knows, as working JSON Schema', () => {
    // POST /programs: createProgramInputSchema — name 2..80 characters, product and board required.
    const body = op('POST', '/programs').requestBody.content['application/json'].schema;
    expect(body.type).toBe('object');
    expect(body.required.sort()).toEqual(['board', 'name', 'product']);
    expect(body.properties.name).toMatchObject({ type: 'string', minLength: 2, maxLength: 80 });
    // Read back into zod (z.fromJSONSchema): the description accepts and refuses what the server does.
    const back = z.fromJSONSchema(body);
    expect(back.safeParse({ name: 'led-strip', product: 'LED status strip', board: 'HCI-LS2 rev A' }).success).toBe(true);
    expect(back.safeParse({ name: 'x', product: 'LED status strip', board: 'HCI-LS2 rev A' }).success).toBe(false);

    // POST /run-files/:id/problems: params {id: uuid} and problemReportInputSchema (text ≥ 10 characters).
    const problems = op('POST', '/run-files/:id/problems');
    expect(problems.parameters).toEqual([{ name: 'id', in: 'path', required: true, schema: expect.objectContaining({ type: 'string', format: 'uuid' }) }]);
    expect(problems.requestBody.content['application/json'].schema.properties.text).toMatchObject({ type: 'string', minLength: 10, maxLength: 4000 });

    // GET /run-files/:id/:file: the file parameter's pattern comes from the route's params schema.
    const file = op('GET', '/run-files/:id/:file').parameters.find((p: Json) => p.name === 'file');
    expect(new RegExp(file.schema.pattern).test('bottom.json')).toBe(true);
    expect(new RegExp(file.schema.pattern).test('left.csv')).toBe(false);
    expect(op('GET', '/run-files/:id/:file').responses['200'].headers['X-Content-SHA256']).toBeDefined();

    // GET /revisions/:id/run: the side query parameter, optional with its default.
    const side = op('GET', '/revisions/:id/run').parameters.find((p: Json) => p.in === 'query');
    expect(side).toMatchObject({ name: 'side', required: false, schema: { enum: ['top', 'bottom'], default: 'top' } });

    // POST /tokens: createTokenInputSchema.
    expect(op('POST', '/tokens').requestBody.content['application/json'].schema.required).toEqual(['name']);
    // Uploads are described as multipart forms.
    const upload = op('POST', '/revisions/:id/centroid').requestBody.content['multipart/form-data'].schema;
    expect(upload.required.sort()).toEqual(['file', 'version']);
    // Routes without validation have no request body.
    expect(op('GET', '/run-files').requestBody).toBeUndefined();
  });

  it('has no schema that zod could not represent', () => {
    expect(JSON.stringify(doc)).not.toMatch(/Not representable/);
  });

  it('carries response schemas where they are named, and the problem body', () => {
    const list = op('GET', '/run-files').responses['200'].content['application/json'].schema;
    expect(list.properties.items.type).toBe('array');
    expect(list.properties.items.items.required).toEqual(expect.arrayContaining(['revisionId', 'state', 'files']));
    expect(op('POST', '/tokens').responses['201'].content['application/json'].schema.required).toEqual(['token', 'item']);
    expect(op('DELETE', '/tokens/:id').responses['204']).toBeDefined();
    expect(doc.components.schemas.Problem.required).toEqual(expect.arrayContaining(['status', 'title', 'detail']));
    expect(op('POST', '/programs').responses['400'].content['application/json'].schema).toEqual({ $ref: '#/components/schemas/Problem' });
  });
});
