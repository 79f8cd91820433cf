import type { AppError, ErrorKind } from "../platform/errors";

/** The HTTP status of each kind of application error (RFC 9110 §15); the only place the two vocabularies meet. */
export const STATUS_OF_KIND: Record<ErrorKind, number> = {
  invalid: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  rate_limited: 429,
  unavailable: 503,
};

export const httpStatusOf = (err: AppError) => STATUS_OF_KIND[err.kind];
