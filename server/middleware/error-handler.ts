import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { Problem } from '../../shared/schemas/problem.schema';
import { EngineInputError, byteSizeText } from '../../shared/core';
import { DomainError, NotFoundError, ServiceUnavailableError, isDatabaseUnavailable, uniqueViolation } from '../lib/errors';

function problem(status: number, title: string, detail: string, errors: Problem['errors'] = []): Problem {
  return { status, title, detail, errors };
}

/** Unknown /api routes answer a problem body too, not the SPA page. */
export const apiNotFound: RequestHandler = (req) => {
  throw new NotFoundError(`The API route ${req.method} ${req.originalUrl.split('?')[0]}`);
};

/**
 * The one error handler: domain errors keep their status and message; errors from body parsing,
 * uploads and CSRF get a clear message; anything else is a 500 without internals.
 */
export const errorHandler: ErrorRequestHandler = (err, _req, res, _next) => {
  let body: Problem;
  // A unique index refused a row another request wrote first (a race): 409 naming the field.
  const dup = uniqueViolation(err);
  if (dup) err = dup;
  // PostgreSQL down or unreachable: 503 with a retry hint, never a 500.
  else if (!(err instanceof DomainError) && isDatabaseUnavailable(err)) {
    err = new ServiceUnavailableError('The database is not answering, so this cannot be done just now. Try again in a few seconds; if it goes on, tell an admin (the PostgreSQL server may be stopped or restarting).');
  }
  if (err instanceof ServiceUnavailableError) res.setHeader('Retry-After', String(err.retryAfterSeconds));
  if (err instanceof DomainError) {
    body = problem(err.status, err.title, err.message, err.errors);
  } else if (err instanceof EngineInputError) {
    // The engine names the file, line, column or field: keep each as the error's path.
    const where = [err.file, err.line !== undefined ? `line ${err.line}` : null, err.column !== undefined ? `column "${err.column}"` : null, err.field ?? null].filter(Boolean).join(', ');
    body = problem(400, 'Invalid input', where ? `${where}: ${err.detail}` : err.detail, [{ path: where || '(input)', message: err.detail }]);
  } else if (err?.type === 'entity.parse.failed') {
    body = problem(400, 'Malformed JSON', 'The request body is not valid JSON. Check quotes, commas and brackets.');
  } else if (err?.type === 'entity.too.large') {
    body = problem(413, 'Body too large', `The request body is larger than the ${err.limit ? byteSizeText(err.limit) : 'allowed'} limit.`);
  } else if (err?.code === 'EBADCSRFTOKEN' || err?.code === 'ERR_BAD_CSRF_TOKEN' || /csrf/i.test(err?.message ?? '')) {
    body = problem(403, 'Missing or invalid CSRF token', 'Reload the page and try again: the form\u2019s security token is missing or out of date.');
  } else if (err?.name === 'MulterError') {
    const detail = err.code === 'LIMIT_FILE_SIZE' ? 'The file is larger than the upload limit.' : `Upload rejected: ${err.message}.`;
    body = problem(err.code === 'LIMIT_FILE_SIZE' ? 413 : 400, 'Upload rejected', detail, err.field ? [{ path: err.field, message: detail }] : []);
  } else if (typeof err?.status === 'number' && err.status >= 400 && err.status < 500) {
    body = problem(err.status, 'Bad request', String(err.message ?? 'Bad request'));
  } else {
    if (process.env.NODE_ENV !== 'test') console.error(err);
    body = problem(500, 'Server error', 'Something went wrong on the server. The error was logged; try again, and tell an admin if it persists.');
  }
  if (res.headersSent) return;
  res.status(body.status).type('application/problem+json').json(body);
};
