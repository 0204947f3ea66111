/**
 * Domain errors. Services throw these; the one error handler (middleware/error-handler.ts) maps
 * them to a status and the JSON problem body. Routes never catch.
 */
export interface FieldError {
  path: string;
  message: string;
}

export class DomainError extends Error {
  constructor(
    readonly status: number,
    readonly title: string,
    message: string,
    readonly errors: FieldError[] = [],
  ) {
    super(message);
    this.name = new.target.name;
  }
}

export class BadRequestError extends DomainError {
  constructor(message: string, errors: FieldError[] = []) {
    super(400, 'Bad request', message, errors);
  }
}

export class ValidationError extends DomainError {
  constructor(message: string, errors: FieldError[]) {
    super(400, 'Invalid input', message, errors);
  }
}

export class UnauthenticatedError extends DomainError {
  constructor(message = 'Sign in to continue.') {
    super(401, 'Not signed in', message);
  }
}

export class ForbiddenError extends DomainError {
  constructor(message = 'Your roles do not allow this.') {
    super(403, 'Forbidden', message);
  }
}

export class NotFoundError extends DomainError {
  constructor(what: string) {
    super(404, 'Not found', `${what} was not found.`);
  }
}

export class ConflictError extends DomainError {
  constructor(message: string, errors: FieldError[] = []) {
    super(409, 'Conflict', message, errors);
  }
}

export class TooManyRequestsError extends DomainError {
  constructor(message: string) {
    super(429, 'Too many requests', message);
  }
}

/** Seconds a client is asked to wait when the database does not answer (a common, short pause). */
export const DATABASE_RETRY_AFTER_SECONDS = 5;

export class ServiceUnavailableError extends DomainError {
  constructor(
    message: string,
    readonly retryAfterSeconds = DATABASE_RETRY_AFTER_SECONDS,
  ) {
    super(503, 'Database unavailable', message);
  }
}

// PostgreSQL error codes (PostgreSQL documentation, appendix "PostgreSQL Error Codes"): class 08
// is "connection exception"; 57P01–57P03 are admin shutdown, crash shutdown and "cannot connect
// now" (starting up or shutting down); 53300 is too many connections.
const PG_UNAVAILABLE = /^(08\d{3}|57P0[123]|53300)$/;
// Node's socket errors when nothing answers at the address.
const NET_UNAVAILABLE = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'ENOTFOUND', 'EAI_AGAIN', 'EPIPE']);
// What node-postgres says when a connection drops or the pool cannot get one in time.
const PG_CLIENT_MESSAGES = /Connection terminated|timeout exceeded when trying to connect|Client has encountered a connection error|Connection terminated due to connection timeout/i;

/** True when `err` says the database cannot be reached (down, restarting, or unreachable). */
export function isDatabaseUnavailable(err: unknown): boolean {
  const seen = new Set<unknown>();
  const walk = (e: unknown): boolean => {
    if (!e || typeof e !== 'object' || seen.has(e)) return false;
    seen.add(e);
    const x = e as { code?: unknown; message?: unknown; driverError?: unknown; cause?: unknown; errors?: unknown };
    if (typeof x.code === 'string' && (PG_UNAVAILABLE.test(x.code) || NET_UNAVAILABLE.has(x.code))) return true;
    if (typeof x.message === 'string' && PG_CLIENT_MESSAGES.test(x.message)) return true;
    if (Array.isArray(x.errors) && x.errors.some(walk)) return true; // AggregateError (IPv4 and IPv6 both refused)
    return walk(x.driverError) || walk(x.cause);
  };
  return walk(err);
}

/**
 * A unique index said no (PostgreSQL error 23505, "unique_violation"): which field, and the
 * value already taken. Every unique index of the schema is listed with the field the API names;
 * an index not listed falls back to the column in PostgreSQL's own detail text.
 */
const UNIQUE_FIELDS: Record<string, { path: string; what: string }> = {
  uq_programs_name_ci: { path: 'name', what: 'A program with this name already exists (names are compared without case)' },
  UQ_97672ac88f789774dd47f7c8be3: { path: 'email', what: 'A user with this e-mail already exists' },
  uq_library_packages_name_key: { path: 'name', what: 'A package with this name already exists (names are compared without case)' },
  uq_library_aliases_pattern_key: { path: 'pattern', what: 'This alias already exists (aliases are compared without case)' },
  uq_library_nozzles_name_ci: { path: 'name', what: 'A nozzle with this name already exists (names are compared without case)' },
  uq_library_vision_presets_name_ci: { path: 'name', what: 'A vision preset with this name already exists (names are compared without case)' },
  uq_library_machines_name_ci: { path: 'name', what: 'A machine profile with this name already exists (names are compared without case)' },
  uq_library_unmatched_key: { path: 'footprint', what: 'This footprint is already in the unmatched queue' },
  uq_program_revisions_label: { path: 'label', what: 'Someone started a revision of this program at the same moment; reload to see it' },
  uq_revision_waivers_key: { path: 'key', what: 'This finding is already waived' },
  uq_release_files: { path: 'revision', what: 'This revision was released at the same moment by someone else; reload to see it' },
};

const camel = (s: string) => s.replace(/_([a-z])/g, (_m, c: string) => c.toUpperCase());

export function uniqueViolation(err: unknown): ConflictError | null {
  const d = (err as { driverError?: unknown })?.driverError ?? err;
  const x = d as { code?: unknown; constraint?: unknown; detail?: unknown };
  if (!x || x.code !== '23505') return null;
  // e.g. `Key (lower(name::text))=(led-strip) already exists.` or `Key (email)=(a@b.c) already exists.`
  const m = typeof x.detail === 'string' ? /^Key \((.+)\)=\((.*)\) already exists\.?$/s.exec(x.detail) : null;
  const value = m?.[2];
  const known = typeof x.constraint === 'string' ? UNIQUE_FIELDS[x.constraint] : undefined;
  const column = m?.[1].replace(/^lower\(\(?|\)?(::\w+( \w+)*)?\)$/g, '').replace(/::\w+.*$/, '').replace(/_key$/, '').replace(/[()"]/g, '');
  const path = known?.path ?? (column ? camel(column) : '(unknown)');
  const what = known?.what ?? `This ${path} is already in use`;
  const detail = value !== undefined && value.length <= 200 ? `${what}: ${value}.` : `${what}.`;
  return new ConflictError(detail, [{ path, message: value !== undefined && value.length <= 200 ? `${value} is already in use` : 'Already in use' }]);
}
