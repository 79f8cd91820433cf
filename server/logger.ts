import pino, { type DestinationStream, type Logger } from "pino";
import { safeError } from "./log-errors";

export type { Logger };

/**
 * Paths pino blanks wherever they appear in a log object (one level of nesting, pino's redact wildcard rules).
 * The request serializer below already leaves headers and bodies out; this catches a password, hash, token or cookie
 * that someone logs by hand.
 */
export const REDACT_PATHS = [
  "req.headers.authorization",
  "req.headers.cookie",
  'req.headers["x-csrf-token"]',
  'res.headers["set-cookie"]',
  ...[
    "password",
    "currentPassword",
    "newPassword",
    "passwordHash",
    "password_hash",
    "token",
    "tokenHash",
    "token_hash",
    "csrfToken",
    "secret",
    "cookie",
    "authorization",
    "params",
  ].flatMap((k) => [k, `*.${k}`]),
];

/** Query values can carry e-mails, ids or tokens: keep the names, drop the values. */
export function redactQuery(url: string): string {
  const q = url.indexOf("?");
  if (q < 0) return url;
  const names = [...new URLSearchParams(url.slice(q + 1)).keys()];
  return names.length
    ? `${url.slice(0, q)}?${names.map((n) => `${encodeURIComponent(n)}=[redacted]`).join("&")}`
    : url.slice(0, q);
}

export interface LoggerOptions {
  level: string;
  /** Where lines go; stdout by default. Tests pass an in-memory stream. */
  destination?: DestinationStream;
}

/** One JSON line per event; errors go through safeError so driver errors never print parameters or client state. */
export function createLogger({ level, destination }: LoggerOptions): Logger {
  return pino(
    {
      level,
      base: { app: "ropewalk" },
      redact: { paths: REDACT_PATHS, censor: "[redacted]" },
      serializers: { err: safeError, error: safeError },
    },
    destination,
  );
}
