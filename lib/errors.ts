/**
 * Expected failures of Stokeline's domain. Every one carries a stable machine
 * code, a plain-words message that tells the user what to fix, and the HTTP
 * status an edge should answer with. Edges turn them into responses in one
 * helper; anything that is not a DomainError is a bug and answers 500 without
 * leaking its stack.
 */
export class DomainError extends Error {
  readonly code: string;
  readonly status: number;
  readonly details?: unknown;

  constructor(code: string, message: string, status = 400, details?: unknown) {
    super(message);
    this.name = new.target.name;
    this.code = code;
    this.status = status;
    this.details = details;
  }
}

/** The uploaded layout cannot be read or has no usable channel network. */
export class LayoutError extends DomainError {
  constructor(code: string, message: string, details?: unknown) {
    super(code, message, 422, details);
  }
}

/** The conditions document (units, layers, fluid, ports…) is invalid. */
export class ConditionsError extends DomainError {
  constructor(code: string, message: string, details?: unknown) {
    super(code, message, 400, details);
  }
}

/** The hydraulic network cannot be solved as posed (floating part, no reference…). */
export class SolveError extends DomainError {
  constructor(code: string, message: string, details?: unknown) {
    super(code, message, 422, details);
  }
}

export class UnauthenticatedError extends DomainError {
  constructor(message = "Sign in to continue.") {
    super("unauthenticated", message, 401);
  }
}

export class ForbiddenError extends DomainError {
  constructor(message = "You do not have permission to do that.") {
    super("forbidden", message, 403);
  }
}

export class NotFoundError extends DomainError {
  constructor(message = "Not found.") {
    super("not_found", message, 404);
  }
}

/** The object is not in a state that allows this step (review path, frozen revision…). */
export class ConflictError extends DomainError {
  constructor(code: string, message: string, details?: unknown) {
    super(code, message, 409, details);
  }
}

export class RateLimitedError extends DomainError {
  constructor(message: string, readonly retryAfterS: number) {
    super("rate_limited", message, 429);
  }
}
