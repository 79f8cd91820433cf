import { Invalid } from "./errors";

/**
 * Limits on any JSON we accept (request bodies, query strings, multipart fields, uploaded config files), checked
 * before a value reaches zod, PostgreSQL or the response writer. See docs/input-limits.md.
 *
 * - Depth: PostgreSQL's jsonb parser stops at its stack limit and V8's JSON.stringify overflows a few thousand levels
 *   down, so a value nested that deep could be stored and then break every reader (GET /api/models did). No document
 *   we read needs more than a handful of levels: a plan body is 5 deep, a model config's rope block 3.
 * - NUL: PostgreSQL text and jsonb cannot hold U+0000 ("invalid byte sequence" / "unsupported Unicode escape").
 */
export const MAX_JSON_DEPTH = 32;

const NUL = "\u0000";
/** Path segments shown in a field name: enough to find the input, not thousands of "a.a.a". */
const SHOWN_SEGMENTS = 3;

export interface HostileFinding {
  path: (string | number)[];
  message: string;
}

const shown = (key: string | number) => (typeof key === "string" ? key.replaceAll(NUL, "\\u0000") : key);

/** The first NUL character or over-deep nesting in a parsed JSON value; iterative, so depth itself cannot overflow. */
export function findHostile(value: unknown, maxDepth = MAX_JSON_DEPTH): HostileFinding | undefined {
  const stack: { v: unknown; path: (string | number)[] }[] = [{ v: value, path: [] }];
  while (stack.length) {
    const { v, path } = stack.pop()!;
    if (typeof v === "string") {
      if (v.includes(NUL)) return { path: path.map(shown), message: "must not contain the NUL character (U+0000)" };
      continue;
    }
    if (typeof v !== "object" || v === null) continue;
    if (path.length >= maxDepth) {
      return {
        path: path.slice(0, SHOWN_SEGMENTS).map(shown),
        message: `nested deeper than ${maxDepth} levels, the limit for any JSON we accept`,
      };
    }
    const entries: [string | number, unknown][] = Array.isArray(v) ? v.map((x, i) => [i, x]) : Object.entries(v);
    for (const [k, x] of entries) {
      if (typeof k === "string" && k.includes(NUL))
        return { path: [...path, k].map(shown), message: "field names must not contain the NUL character (U+0000)" };
      stack.push({ v: x, path: [...path, k] });
    }
  }
  return undefined;
}

/** Throws a 400 naming the field (or "(what)" for the whole value) when `value` holds a NUL or nests too deep. */
export function assertNotHostile(value: unknown, what: string, prefix: (string | number)[] = []) {
  const found = findHostile(value);
  if (!found) return;
  const path = [...prefix, ...found.path];
  const field = path.length ? path.join(".") : `(${what})`;
  throw new Invalid(`invalid ${what}: ${field} ${found.message}`, { [field]: found.message });
}
