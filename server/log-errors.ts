/**
 * What of an error may reach the log. Driver errors are the danger: drizzle-orm 0.45's DrizzleQueryError message is
 * "Failed query: <sql>\nparams: <values>" (the values include bcrypt hashes on user writes), node-postgres errors carry
 * `detail` ("Key (email)=(…) already exists") and data-exception messages quote the offending value, and objects
 * reachable from them (a pg Client) hold connection secrets. So the log gets a whitelist: type, a cleaned message,
 * SQLSTATE and schema names, and the stack frames without the message line.
 */
export interface SafeError {
  type: string;
  message: string;
  code?: string;
  severity?: string;
  table?: string;
  column?: string;
  constraint?: string;
  stack?: string;
  cause?: SafeError;
}

type Loose = Error & Record<string, unknown>;

const str = (v: unknown) => (typeof v === "string" && v.length > 0 ? v : undefined);

/** SQLSTATE classes 22 (data exception) and 23 (integrity violation) quote the value that failed. */
const quotesValues = (code: string | undefined) => code !== undefined && /^2[23]/.test(code);

function cleanMessage(e: Loose): string {
  const message = String(e.message ?? "");
  // DrizzleQueryError: keep the statement (placeholders only), drop the parameter list.
  if (typeof e.query === "string" && "params" in e) return `Failed query: ${e.query}`;
  if (quotesValues(str(e.code))) return message.replace(/"[^"]*"/g, '"…"').replace(/\(.*?\)=\(.*?\)/g, "(…)=(…)");
  return message.split("\n")[0];
}

/** Stack frames only: the first line of a stack repeats the message, which may hold the values removed above. */
const framesOf = (stack: unknown) =>
  typeof stack === "string"
    ? stack
        .split("\n")
        .filter((l) => /^\s+at /.test(l))
        .slice(0, 12)
        .join("\n") || undefined
    : undefined;

export function safeError(err: unknown, depth = 0): SafeError {
  if (!(err instanceof Error))
    return { type: typeof err, message: typeof err === "string" ? err.split("\n")[0] : "non-error value thrown" };
  const e = err as Loose;
  const out: SafeError = { type: e.constructor?.name || e.name || "Error", message: cleanMessage(e) };
  const code = str(e.code);
  if (code) out.code = code;
  for (const k of ["severity", "table", "column", "constraint"] as const) {
    const v = str(e[k]);
    if (v) out[k] = v;
  }
  const frames = framesOf(e.stack);
  if (frames) out.stack = frames;
  if (e.cause !== undefined && depth < 3) out.cause = safeError(e.cause, depth + 1);
  return out;
}
