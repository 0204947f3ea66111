// zod → EngineInputError with the failing field path.
import type { z } from 'zod';
import { EngineInputError } from './errors';

export function issuePath(path: ReadonlyArray<PropertyKey>): string {
  let s = '';
  for (const p of path) s += typeof p === 'number' ? `[${p}]` : s ? `.${String(p)}` : String(p);
  return s || '(root)';
}

export function parseWith<S extends z.ZodType>(schema: S, data: unknown, file?: string): z.output<S> {
  const r = schema.safeParse(data);
  if (r.success) return r.data;
  const issue = r.error.issues[0];
  const field = issuePath(issue.path);
  throw new EngineInputError(issue.message, { file, field, code: 'bad-field' });
}
