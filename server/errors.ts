/**
 * Errors the services throw. Each carries an HTTP status and a stable code; the one error
 * handler turns them into RFC 9457 problem JSON.
 */
export interface FieldError {
  path: string;
  message: string;
}

export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly errors?: FieldError[],
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export class BadRequest extends AppError {
  constructor(message: string, errors?: FieldError[]) {
    super(400, "bad_request", message, errors);
  }
}
export class Unauthenticated extends AppError {
  constructor(message = "Sign in first.") {
    super(401, "unauthenticated", message);
  }
}
export class Forbidden extends AppError {
  constructor(message = "You are not allowed to do this.", code = "forbidden") {
    super(403, code, message);
  }
}
export class NotFound extends AppError {
  constructor(what = "That record", code = "not_found") {
    super(404, code, `${what} was not found.`);
  }
}
export class Conflict extends AppError {
  constructor(message: string, code = "conflict", extra?: Record<string, unknown>) {
    super(409, code, message, undefined, extra);
  }
}
export class RuleBroken extends AppError {
  constructor(message: string, errors?: FieldError[], code = "rule_broken", extra?: Record<string, unknown>) {
    super(422, code, message, errors, extra);
  }
}
export class UnsupportedMedia extends AppError {
  constructor(message: string, field: string, code = "unsupported_media") {
    super(415, code, message, [{ path: field, message }]);
  }
}
