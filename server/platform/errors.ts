/**
 * Typed application errors thrown by services, repos and middleware. They say what went wrong in the application's terms
 * (a kind, a stable code for clients, a message and the fields at fault) and nothing about the web: the HTTP status of
 * each kind is decided in one place, server/http/error-status.ts, which error-middleware.ts uses to answer
 * { error: { code, message, fields? } }.
 */
export type ErrorKind =
  | "invalid" // the input is wrong; fields name what
  | "unauthenticated" // nobody is signed in, or the credentials are not good
  | "forbidden" // signed in, but the roles or token do not allow it
  | "not_found"
  | "conflict" // the current state refuses it (wrong state, duplicate, changed since read)
  | "rate_limited" // too many tries; retryAfterSeconds says when to come back
  | "unavailable"; // busy or timed out; trying again later may work

export class AppError extends Error {
  constructor(
    readonly kind: ErrorKind,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
  }
}
export class Invalid extends AppError {
  constructor(message: string, fields?: Record<string, string>) {
    super("invalid", "invalid", message, fields);
  }
}
export class NotSignedIn extends AppError {
  constructor(message = "sign in first") {
    super("unauthenticated", "unauthorized", message);
  }
}
export class Forbidden extends AppError {
  constructor(message = "your roles do not allow this") {
    super("forbidden", "forbidden", message);
  }
}
export class NotFound extends AppError {
  constructor(message = "not found") {
    super("not_found", "not_found", message);
  }
}
export class Conflict extends AppError {
  constructor(message: string, fields?: Record<string, string>) {
    super("conflict", "conflict", message, fields);
  }
}
/** Too many tries: the caller should wait retryAfterSeconds before trying again. */
export class RateLimited extends AppError {
  constructor(
    message: string,
    readonly retryAfterSeconds?: number,
    code = "too_many_requests",
  ) {
    super("rate_limited", code, message);
  }
}
/** The work cannot be taken now (queues full, a search ran out of time); the same request may succeed later. */
export class Unavailable extends AppError {
  constructor(code: string, message: string) {
    super("unavailable", code, message);
  }
}
