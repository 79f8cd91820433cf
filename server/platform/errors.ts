/**
 * Typed application errors thrown by services and repos. They live in the platform layer, not in server/http, so
 * a service never depends on the web layer; server/http/error-middleware.ts maps them to { error: { code, message, fields? } }.
 */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
  }
}
export class Invalid extends HttpError {
  constructor(message: string, fields?: Record<string, string>) {
    super(400, "invalid", message, fields);
  }
}
export class Unauthorized extends HttpError {
  constructor(message = "sign in first") {
    super(401, "unauthorized", message);
  }
}
export class Forbidden extends HttpError {
  constructor(message = "your roles do not allow this") {
    super(403, "forbidden", message);
  }
}
export class NotFound extends HttpError {
  constructor(message = "not found") {
    super(404, "not_found", message);
  }
}
export class Conflict extends HttpError {
  constructor(message: string, fields?: Record<string, string>) {
    super(409, "conflict", message, fields);
  }
}
/** 429 with a Retry-After header (seconds): the caller should wait before trying again. */
export class TooManyRequests extends HttpError {
  constructor(
    message: string,
    readonly retryAfterSeconds: number,
    code = "too_many_requests",
  ) {
    super(429, code, message);
  }
}
