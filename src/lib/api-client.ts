import type { z } from 'zod';
import { problemSchema, type Problem } from '../../shared/schemas/problem.schema';

/** An API answer other than 2xx, with the server's problem body. */
export class ApiError extends Error {
  constructor(readonly problem: Problem) {
    super(problem.detail || problem.title);
    this.name = 'ApiError';
  }
  get status() {
    return this.problem.status;
  }
  /** The message for one form field, if the server named it. */
  fieldError(path: string): string | undefined {
    return this.problem.errors.find((e) => e.path === path)?.message;
  }
}

let csrfToken: string | null = null;

async function fetchCsrfToken(): Promise<string> {
  const res = await fetch('/api/auth/csrf', { credentials: 'same-origin' });
  const body = (await res.json()) as { token: string };
  csrfToken = body.token;
  return csrfToken;
}

export function setCsrfToken(token: string | null) {
  csrfToken = token;
}

/** The CSRF token for a request made outside api() (e.g. an upload with progress). */
export async function getCsrfToken(): Promise<string> {
  return csrfToken ?? fetchCsrfToken();
}

/**
 * POSTs a multipart form with upload progress (fetch cannot report it). Resolves with the parsed
 * JSON; rejects with ApiError carrying the server's problem body.
 */
export async function uploadForm<S extends z.ZodType>(path: string, form: FormData, opts: { schema?: S; onProgress?: (fraction: number) => void } = {}): Promise<z.infer<S>> {
  const token = await getCsrfToken();
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api${path}`);
    xhr.setRequestHeader('X-CSRF-Token', token);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) opts.onProgress?.(e.loaded / e.total);
    };
    xhr.onerror = () => reject(new ApiError({ status: 0, title: 'No connection', detail: 'The upload did not reach the server. Check your connection and try again.', errors: [] }));
    xhr.onload = () => {
      let body: unknown = null;
      try {
        body = xhr.responseText ? JSON.parse(xhr.responseText) : null;
      } catch {
        /* not JSON */
      }
      if (xhr.status >= 200 && xhr.status < 300) {
        try {
          resolve(opts.schema ? parseAnswer(opts.schema, body, path) : (body as z.infer<S>));
        } catch (e) {
          reject(e);
        }
      } else {
        const p = problemSchema.safeParse(body);
        reject(new ApiError(p.success ? p.data : { status: xhr.status, title: 'Error', detail: `The server answered ${xhr.status}.`, errors: [] }));
      }
    };
    xhr.send(form);
  });
}

interface RequestOptions<S extends z.ZodType> {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: unknown;
  schema?: S;
  signal?: AbortSignal;
}

async function toProblem(res: Response): Promise<Problem> {
  try {
    const parsed = problemSchema.safeParse(await res.json());
    if (parsed.success) return parsed.data;
  } catch {
    /* not JSON */
  }
  return { status: res.status, title: res.statusText || 'Error', detail: `The server answered ${res.status}.`, errors: [] };
}

/** Fetches JSON from the API; parses it with the shared zod schema when given one. */
export async function api<S extends z.ZodType = z.ZodUnknown>(path: string, opts: RequestOptions<S> = {}): Promise<z.infer<S>> {
  const method = opts.method ?? 'GET';
  const send = async (retry: boolean): Promise<Response> => {
    const headers: Record<string, string> = { Accept: 'application/json' };
    if (opts.body !== undefined && !(opts.body instanceof FormData)) headers['Content-Type'] = 'application/json';
    if (method !== 'GET') headers['X-CSRF-Token'] = csrfToken ?? (await fetchCsrfToken());
    const res = await fetch(`/api${path}`, {
      method,
      headers,
      credentials: 'same-origin',
      signal: opts.signal,
      body: opts.body === undefined ? undefined : opts.body instanceof FormData ? opts.body : JSON.stringify(opts.body),
    });
    if (res.status === 403 && method !== 'GET' && retry) {
      const copy = res.clone();
      const p = await toProblem(copy);
      if (/csrf/i.test(p.title)) {
        await fetchCsrfToken();
        return send(false);
      }
    }
    return res;
  };
  let res: Response;
  try {
    res = await send(true);
  } catch (err) {
    if ((err as Error).name === 'AbortError') throw err;
    throw new ApiError({ status: 0, title: 'No connection', detail: 'The server could not be reached. Check your connection and try again.', errors: [] });
  }
  if (!res.ok) throw new ApiError(await toProblem(res));
  if (res.status === 204) return undefined as z.infer<S>;
  const data = await res.json();
  return opts.schema ? parseAnswer(opts.schema, data, path) : data;
}

/** A response that does not match its schema is a bug or a stale page, not the user's fault. */
function parseAnswer<S extends z.ZodType>(schema: S, data: unknown, path: string): z.infer<S> {
  const parsed = schema.safeParse(data);
  if (parsed.success) return parsed.data;
  console.error(`Unexpected answer from /api${path}`, parsed.error.issues);
  throw new ApiError({
    status: 0,
    title: 'Unexpected answer',
    detail: 'The server answered in a form this page does not understand. Reload the page (Placewright may have been updated); if it persists, tell an admin.',
    errors: [],
  });
}
