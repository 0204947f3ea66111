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
