import type { RequestHandler } from 'express';
import { z } from 'zod';
import { healthSchema } from '../../shared/schemas/audit.schema';
import { meSchema, userSchema } from '../../shared/schemas/auth.schema';
import { problemSchema } from '../../shared/schemas/problem.schema';
import { apiTokenSchema, programSchema, revisionDetailSchema, runFileSchema } from '../../shared/schemas/program.schema';
import { setupSheetSchema } from '../../shared/schemas/run-file.schema';
import { ROUTE_DOC, VALIDATES, doc, type Access, type ApiRoutes, type RouteDoc, type RouteSpec, type ValidationTag } from './routes';

/**
 * The OpenAPI 3.1 description of the API, built from what the routes already know: their access
 * (ApiRoutes), the zod schemas validate() parses with, and doc() where a route names its response.
 * Schemas go through zod 4's own z.toJSONSchema (JSON Schema 2020-12, OpenAPI 3.1's dialect).
 */

type Json = Record<string, unknown>;

/** Responses and summaries of routes whose routers carry no doc() yet; doc() on a route wins. */
const KNOWN: Record<string, RouteDoc> = {
  'GET /health': { summary: 'Service and database health', response: healthSchema },
  'GET /auth/csrf': { summary: 'A CSRF token for the X-CSRF-Token header', response: z.object({ token: z.string() }) },
  'POST /auth/sign-in': { summary: 'Sign in with e-mail and password (sets the session cookie)' },
  'POST /auth/sign-out': { summary: 'Sign out' },
  'GET /me': { summary: 'The signed-in user', response: meSchema },
  'GET /users': { summary: 'List users', response: z.object({ items: z.array(userSchema) }) },
  'POST /users': { summary: 'Create a user', status: 201, response: userSchema },
  'GET /users/:id': { summary: 'One user', response: userSchema },
  'PATCH /users/:id': { summary: 'Change a user (name, roles, active)', response: userSchema },
  'GET /programs': { summary: 'List programs with their revisions', response: z.object({ items: z.array(programSchema) }) },
  'POST /programs': { summary: 'Create a program with its first revision', status: 201, response: programSchema },
  'GET /programs/:id': { summary: 'One program with its revisions', response: programSchema },
  'GET /revisions/:id': { summary: 'One revision with settings, findings, waivers and comments', response: revisionDetailSchema },
  'PUT /revisions/:id/settings': { summary: 'Save the job settings of a draft revision', response: revisionDetailSchema },
  'POST /revisions/:id/checks': { summary: 'Run the checks of a revision', response: revisionDetailSchema },
  'POST /revisions/:id/submit': { summary: 'Submit a revision for review', response: revisionDetailSchema },
  'POST /revisions/:id/approve': { summary: 'Approve and release a revision (reviewer other than the author)', response: revisionDetailSchema },
  'POST /revisions/:id/reject': { summary: 'Send a revision back to its author', response: revisionDetailSchema },
  'POST /revisions/:id/centroid/preview': { summary: 'Read a centroid file and show how it would import, without saving', request: { contentType: 'multipart/form-data', schema: z.object({ file: z.string().meta({ contentMediaType: 'text/csv' }), options: z.string().optional().describe('the import options, as JSON') }) } },
  'POST /revisions/:id/centroid': { summary: 'Import a centroid file into a draft revision', response: revisionDetailSchema, request: { contentType: 'multipart/form-data', schema: z.object({ file: z.string().meta({ contentMediaType: 'text/csv' }), options: z.string().optional().describe('the import options, as JSON'), version: z.string().describe('the revision version you saw') }) } },
  'GET /run-files': { summary: 'Released and superseded revisions with their run files, newest release first', response: z.object({ items: z.array(runFileSchema) }) },
  'GET /run-files/:id/setup-sheet': { summary: 'What the printable set-up sheet of a released revision shows', response: setupSheetSchema },
  'GET /run-files/:id/:file': {
    summary: 'Download one side of the neutral placement list (top.csv, top.json, bottom.csv or bottom.json)',
    description: 'The body is the stored file, byte for byte; the header `X-Content-SHA256` carries its SHA-256 (hex).',
    responseContentType: 'text/csv',
  },
  'POST /run-files/:id/problems': { summary: 'Report a problem with a run file to its author', status: 201, response: z.object({ ok: z.literal(true) }) },
  'GET /tokens': { summary: 'List line-computer tokens', response: z.object({ items: z.array(apiTokenSchema) }) },
  'POST /tokens': { summary: 'Create a line-computer token (the token is in this answer only)', status: 201, response: z.object({ token: z.string(), item: apiTokenSchema }) },
  'DELETE /tokens/:id': { summary: 'Revoke a line-computer token' },
  'GET /openapi.json': { summary: 'This description (OpenAPI 3.1)' },
};

/** A zod schema as JSON Schema 2020-12, without the `$schema` key (the document names its dialect). */
export function jsonSchema(schema: z.ZodType, io: 'input' | 'output'): Json {
  try {
    const { $schema: _drop, ...rest } = z.toJSONSchema(schema, { io, unrepresentable: 'any', target: 'draft-2020-12' }) as Json;
    return rest;
  } catch (err) {
    return { description: `Not representable as JSON Schema: ${(err as Error).message}` };
  }
}

/** `/run-files/:id/:file` → `/run-files/{id}/{file}` */
export const openApiPath = (path: string) => path.replace(/:([A-Za-z_][A-Za-z0-9_]*)/g, '{$1}');

const pathParams = (path: string) => [...path.matchAll(/:([A-Za-z_][A-Za-z0-9_]*)/g)].map((m) => m[1]);

function accessText(access: Access): string {
  if (access === 'public') return 'Access: public (no sign-in).';
  if (access === 'signed-in') return 'Access: any signed-in user.';
  const roles = access.filter((r) => r !== 'line-token');
  const text = `Access: the ${roles.join(' or ')} role (admin always passes).`;
  return access.includes('line-token') ? `${text} Line computers may call it with \`Authorization: Bearer <token>\` (a read-only line token).` : text;
}

function security(spec: RouteSpec): Json[] {
  const mutating = spec.method !== 'GET';
  // The CSRF header is checked on every mutating /api request, signed in or not.
  if (spec.access === 'public') return mutating ? [{ csrfHeader: [] }] : [];
  const session = mutating ? { sessionCookie: [], csrfHeader: [] } : { sessionCookie: [] };
  return typeof spec.access !== 'string' && spec.access.includes('line-token') ? [session, { lineToken: [] }] : [session];
}

function tagsOf(handlers: RequestHandler[] = []) {
  const validations: ValidationTag[] = [];
  let routeDoc: RouteDoc | undefined;
  for (const h of handlers) {
    const v = (h as unknown as Record<symbol, ValidationTag | undefined>)[VALIDATES];
    if (v) validations.push(v);
    const d = (h as unknown as Record<symbol, RouteDoc | undefined>)[ROUTE_DOC];
    if (d) routeDoc = { ...routeDoc, ...d };
  }
  return { validations, routeDoc };
}

function operationId(spec: RouteSpec): string {
  const words = spec.path
    .split('/')
    .filter(Boolean)
    .map((seg) => (seg.startsWith(':') ? `by-${seg.slice(1)}` : seg))
    .join('-')
    .split(/[^A-Za-z0-9]+/)
    .filter(Boolean);
  return [spec.method.toLowerCase(), ...words].map((w, i) => (i === 0 ? w : w[0].toUpperCase() + w.slice(1))).join('');
}

function operation(spec: RouteSpec, handlers: RequestHandler[] | undefined): Json {
  const key = `${spec.method} ${spec.path}`;
  const { validations, routeDoc } = tagsOf(handlers);
  const meta: RouteDoc = { ...KNOWN[key], ...routeDoc };
  const parameters: Json[] = [];

  const paramsSchema = validations.find((v) => v.part === 'params');
  const paramsJson = paramsSchema ? jsonSchema(paramsSchema.schema, 'input') : null;
  for (const name of pathParams(spec.path)) {
    const schema = (paramsJson?.properties as Record<string, Json> | undefined)?.[name] ?? { type: 'string' };
    parameters.push({ name, in: 'path', required: true, schema });
  }
  const query = validations.find((v) => v.part === 'query');
  if (query) {
    const q = jsonSchema(query.schema, 'input');
    const required = new Set((q.required as string[] | undefined) ?? []);
    for (const [name, schema] of Object.entries((q.properties as Record<string, Json> | undefined) ?? {})) {
      parameters.push({ name, in: 'query', required: required.has(name), schema });
    }
  }

  const op: Json = {
    operationId: operationId(spec),
    summary: meta.summary ?? `${spec.method} ${openApiPath(spec.path)}`,
    description: [meta.description, accessText(spec.access)].filter(Boolean).join('\n\n'),
    tags: [spec.path.split('/').filter(Boolean)[0] ?? 'api'],
    'x-placewright-access': spec.access,
    security: security(spec),
  };
  if (parameters.length) op.parameters = parameters;

  const body = validations.find((v) => v.part === 'body');
  if (body) op.requestBody = { required: true, content: { 'application/json': { schema: jsonSchema(body.schema, 'input') } } };
  else if (meta.request) op.requestBody = { required: true, content: { [meta.request.contentType]: { schema: jsonSchema(meta.request.schema, 'input') } } };

  const status = String(meta.status ?? (spec.method === 'DELETE' ? 204 : 200));
  const ok: Json = { description: meta.summary ?? 'Success' };
  if (meta.response) ok.content = { 'application/json': { schema: jsonSchema(meta.response, 'output') } };
  else if (meta.responseContentType) {
    ok.content = { [meta.responseContentType]: { schema: { type: 'string' } }, 'application/json': { schema: { type: 'object' } } };
    ok.headers = { 'X-Content-SHA256': { description: 'SHA-256 of the body, hex', schema: { type: 'string', pattern: '^[0-9a-f]{64}$' } } };
  }
  const problem = { description: 'Problem', content: { 'application/json': { schema: { $ref: '#/components/schemas/Problem' } } } };
  const responses: Json = { [status]: ok };
  if (validations.length) responses['400'] = { ...problem, description: 'A field is not valid; `errors` names each path' };
  if (spec.access !== 'public') {
    responses['401'] = { ...problem, description: 'Not signed in (or the line token is not valid)' };
    responses['403'] = { ...problem, description: 'Signed in without the role this needs' };
  }
  responses.default = problem;
  op.responses = responses;
  return op;
}

export function buildOpenApi(api: ApiRoutes, version: string): Json {
  const paths: Record<string, Json> = {};
  for (const spec of api.specs) {
    const p = openApiPath(spec.path);
    paths[p] ??= {};
    paths[p][spec.method.toLowerCase()] = operation(spec, api.handlers.get(`${spec.method} ${spec.path}`));
  }
  return {
    openapi: '3.1.0',
    jsonSchemaDialect: 'https://json-schema.org/draft/2020-12/schema',
    info: {
      title: 'Placewright API',
      version,
      description:
        'The HTTP API of Placewright. Browsers sign in with a session cookie and send the CSRF token (GET /auth/csrf) in `X-CSRF-Token` on every request that changes something. Line computers download released run files with `Authorization: Bearer <token>` (tokens are made on the Line access page); that token opens nothing else. Errors come as a problem body `{ status, title, detail, errors: [{ path, message }] }`.',
    },
    servers: [{ url: '/api' }],
    paths,
    components: {
      schemas: { Problem: jsonSchema(problemSchema, 'output') },
      securitySchemes: {
        sessionCookie: { type: 'apiKey', in: 'cookie', name: 'pw.sid', description: 'The session cookie set by POST /auth/sign-in.' },
        csrfHeader: { type: 'apiKey', in: 'header', name: 'X-CSRF-Token', description: 'The token of GET /auth/csrf (renewed by sign-in), on every mutating request.' },
        lineToken: { type: 'http', scheme: 'bearer', description: 'A read-only line-computer token (`pwt_…`), accepted only by the run-file download route.' },
      },
    },
  };
}

/** GET /api/openapi.json — public; built once, on first request, when every route is registered. */
export function registerOpenApiRoutes(api: ApiRoutes, version: string) {
  let cached: Json | null = null;
  api.get('/openapi.json', 'public', doc({ summary: 'This description (OpenAPI 3.1)' }), (_req, res) => {
    cached ??= buildOpenApi(api, version);
    res.json(cached);
  });
}
