import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { ValidationError } from '../lib/errors';
import { VALIDATES, type ValidationTag } from '../lib/routes';

type Part = 'body' | 'query' | 'params';

/** Turns zod issues into the problem body's `errors` list (path joined with dots). */
export function zodIssues(error: z.ZodError, prefix?: string) {
  return error.issues.map((i) => ({
    path: [prefix, ...i.path.map(String)].filter(Boolean).join('.') || '(root)',
    message: i.message,
  }));
}

/**
 * validate(schema) — parses `req.body` (or query / params) with a shared zod schema and replaces it
 * with the parsed value; answers 400 with every failing field path otherwise.
 */
export function validate<S extends z.ZodType>(schema: S, part: Part = 'body'): RequestHandler {
  const handler: RequestHandler = (req, _res, next) => {
    const result = schema.safeParse(req[part] ?? {});
    if (!result.success) {
      const errors = zodIssues(result.error, part === 'body' ? undefined : part);
      const first = errors[0];
      throw new ValidationError(
        errors.length === 1 ? `${first.path}: ${first.message}` : `${errors.length} fields need attention.`,
        errors,
      );
    }
    if (part === 'query') {
      // Express 5 makes req.query a getter; keep the parsed copy beside it.
      Object.defineProperty(req, 'query', { value: result.data, writable: true, configurable: true });
    } else {
      (req as unknown as Record<Part, unknown>)[part] = result.data;
    }
    next();
  };
  // Recorded for the OpenAPI description (server/lib/openapi.ts).
  const tag: ValidationTag = { schema, part };
  return Object.assign(handler, { [VALIDATES]: tag });
}
