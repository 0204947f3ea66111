import express, { type RequestHandler, type Router } from 'express';
import type { z } from 'zod';
import type { Role } from '../../shared/schemas/auth.schema';
import { ForbiddenError, UnauthenticatedError } from './errors';

/**
 * Who may call a route. Every API route names its access here; there is no default.
 * - `public`: anyone, signed in or not (sign-in, health, CSRF token)
 * - `signed-in`: any active user
 * - a list of roles: users holding at least one of them (admin holds every role's rights);
 *   `line-token` in the list also lets a line computer's read-only API token through
 */
export type Access = 'public' | 'signed-in' | readonly (Role | 'line-token')[];

export interface RouteSpec {
  method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  path: string;
  access: Access;
}

export function hasAccess(user: Express.User | undefined, access: Access): boolean {
  if (access === 'public') return true;
  if (!user) return false;
  if (access === 'signed-in') return true;
  if (user.roles.includes('admin')) return true;
  return access.some((r) => r !== 'line-token' && user.roles.includes(r));
}

const roleNames = (access: Access) => (typeof access === 'string' ? access : access.filter((r) => r !== 'line-token').join(' or '));

export function guard(access: Access): RequestHandler {
  return (req, _res, next) => {
    if (access === 'public') return next();
    if (req.lineToken) {
      if (typeof access !== 'string' && access.includes('line-token')) return next();
      throw new ForbiddenError('An API token may only download released run files.');
    }
    if (!req.user) throw new UnauthenticatedError();
    if (!hasAccess(req.user, access)) {
      throw new ForbiddenError(`This needs the ${roleNames(access)} role; you are signed in as ${req.user.roles.join(', ') || 'no role'}.`);
    }
    next();
  };
}

/**
 * Collects the API's routes with their access rules, so that a table-driven test can walk every
 * registered route for every role. Build one per app; feature modules add their routes to it.
 */
export class ApiRoutes {
  readonly specs: RouteSpec[] = [];
  readonly router: Router = express.Router();
  /** The handlers of each route ("GET /path"), so the OpenAPI description can read their tags. */
  readonly handlers = new Map<string, RequestHandler[]>();

  private add(method: RouteSpec['method'], path: string, access: Access, handlers: RequestHandler[]) {
    this.specs.push({ method, path, access });
    this.handlers.set(`${method} ${path}`, handlers);
    const m = method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
    this.router[m](path, guard(access), ...handlers);
  }

  get(path: string, access: Access, ...h: RequestHandler[]) { this.add('GET', path, access, h); }
  post(path: string, access: Access, ...h: RequestHandler[]) { this.add('POST', path, access, h); }
  put(path: string, access: Access, ...h: RequestHandler[]) { this.add('PUT', path, access, h); }
  patch(path: string, access: Access, ...h: RequestHandler[]) { this.add('PATCH', path, access, h); }
  delete(path: string, access: Access, ...h: RequestHandler[]) { this.add('DELETE', path, access, h); }
}

// ---- route metadata for the OpenAPI description (server/lib/openapi.ts) ------------------------

/** Where validate() records the schema it parses with, on the handler it returns. */
export const VALIDATES = Symbol.for('placewright.validates');
/** Where doc() records a route's summary and response. */
export const ROUTE_DOC = Symbol.for('placewright.route-doc');

export interface ValidationTag {
  schema: z.ZodType;
  part: 'body' | 'query' | 'params';
}

export interface RouteDoc {
  summary?: string;
  description?: string;
  /** the success status; defaults to 204 for DELETE, else 200 */
  status?: number;
  /** schema of the JSON success body */
  response?: z.ZodType;
  /** a success body that is not JSON (e.g. `text/csv`) */
  responseContentType?: string;
  /** a request body validate() does not see (e.g. multipart uploads) */
  request?: { contentType: string; schema: z.ZodType };
}

/**
 * doc({ summary, response }) — a pass-through handler that only names a route's summary and
 * response schema for the OpenAPI description: `api.get('/x', access, doc({...}), handler)`.
 */
export function doc(meta: RouteDoc): RequestHandler {
  const h: RequestHandler = (_req, _res, next) => next();
  return Object.assign(h, { [ROUTE_DOC]: meta });
}
