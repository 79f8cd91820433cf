/** A unique-constraint violation (drizzle 0.45 wraps the driver error; its `cause.code` is PostgreSQL's 23505). */
export const isUniqueViolation = (e: unknown) =>
  (e as { cause?: { code?: string } })?.cause?.code === "23505" || (e as { code?: string })?.code === "23505";

// SQLSTATE classes and codes that mean "the database is not there right now", not "the request was wrong":
// 08 connection exception, 57P01–57P03 shutdown / cannot connect now, 57014 statement timeout (a hung server),
// 53300 too many connections. Node socket errors and node-postgres' own timeout messages mean the same.
const UNAVAILABLE_CODES = new Set([
  "57P01",
  "57P02",
  "57P03",
  "57014",
  "53300",
  "ECONNREFUSED",
  "ECONNRESET",
  "ETIMEDOUT",
  "EPIPE",
  "EHOSTUNREACH",
  "ENOTFOUND",
  "EAI_AGAIN",
]);
const UNAVAILABLE_MESSAGES = [
  "Connection terminated", // node-postgres: server closed the socket, or connectionTimeoutMillis passed
  "timeout exceeded when trying to connect", // pg-pool: connectionTimeoutMillis
  "Query read timeout", // node-postgres: query_timeout
  "Client has encountered a connection error and is not queryable",
];

/** True when an error (or any error in its `cause` chain, as drizzle wraps driver errors) means PostgreSQL is unreachable. */
export function isDatabaseUnavailable(e: unknown): boolean {
  for (let cur = e, depth = 0; cur && depth < 5; cur = (cur as { cause?: unknown }).cause, depth++) {
    const { code, message } = cur as { code?: unknown; message?: unknown };
    if (typeof code === "string" && (UNAVAILABLE_CODES.has(code) || code.startsWith("08"))) return true;
    if (typeof message === "string" && UNAVAILABLE_MESSAGES.some((m) => message.includes(m))) return true;
    if (cur instanceof AggregateError && cur.errors.some(isDatabaseUnavailable)) return true;
  }
  return false;
}
