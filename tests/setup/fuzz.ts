/**
 * Hostile values and a tiny mutator for the route fuzz test (tests/api/fuzz.serial.test.ts).
 * The values are the classes a fuzz run of every documented route found answering 500: ids beyond a 32-bit
 * integer column, NUL characters (PostgreSQL text and jsonb refuse U+0000), prototype names used as lookup keys,
 * JSON nested thousands deep, and numbers at the edges of IEEE 754 doubles (denormals and the largest finite value).
 */

export const DEEP_LEVELS = 5000;
/** `{"a":{"a":…1…}}`, DEEP_LEVELS deep, as raw JSON text (JSON.stringify itself overflows the stack on such values). */
export const deepJson = (levels = DEEP_LEVELS) => `${'{"a":'.repeat(levels)}1${"}".repeat(levels)}`;

/** Path and query ids (strings, as they arrive in a URL). */
export const HOSTILE_IDS = [
  "2147483648",
  "99999999999999999999",
  "1e400",
  "1%00",
  "constructor",
  "__proto__",
  "-1",
  "1.5",
];

export const NUL = "a\u0000b";
export const HOSTILE_STRINGS = [NUL, "constructor", "__proto__"];
/** 2^31 (one past int4), the smallest denormal, the largest finite double. */
export const HOSTILE_NUMBERS = [2 ** 31, 5e-324, 1.7976931348623157e308];

const DEEP_MARK = "\u0001deep\u0001";
const KEY_MARK = "\u0001key\u0001";
const PROTO_KEYS = `"__proto__":{"x":1},"constructor":{"prototype":{"x":1}},"k\\u0000":1`;

export type Path = (string | number)[];
/** `plain` marks an ordinary finite number: a 400 may then name the partner of a cross-field rule instead. */
export interface Mutation {
  path: Path;
  label: string;
  json: string;
  plain?: boolean;
}

/** Every node of a JSON value with its path (the root itself excluded). */
function nodes(value: unknown, path: Path = []): { path: Path; value: unknown }[] {
  const out: { path: Path; value: unknown }[] = path.length ? [{ path, value }] : [];
  if (Array.isArray(value)) value.forEach((v, i) => out.push(...nodes(v, [...path, i])));
  else if (value && typeof value === "object")
    for (const [k, v] of Object.entries(value)) out.push(...nodes(v, [...path, k]));
  return out;
}

function setAt(root: unknown, path: Path, value: unknown): unknown {
  const copy = structuredClone(root) as Record<string | number, unknown>;
  let at = copy;
  for (const key of path.slice(0, -1)) at = at[key] as Record<string | number, unknown>;
  at[path[path.length - 1]] = value;
  return copy;
}

/** The hostile variants of one base body: each node replaced (or, for objects, given a hostile extra key). */
export function mutations(base: object): Mutation[] {
  const out: Mutation[] = [];
  const add = (path: Path, label: string, replacement: unknown, plain = false) => {
    const json = JSON.stringify(setAt(base, path, replacement))
      .replace(JSON.stringify(DEEP_MARK), deepJson())
      .replace(`${JSON.stringify(KEY_MARK)}:1`, PROTO_KEYS);
    out.push({ path, label, json, plain });
  };
  const withKeys = (value: object) => ({ ...value, [KEY_MARK]: 1 });
  out.push({
    path: [],
    label: "extra keys __proto__, constructor and NUL",
    json: JSON.stringify(withKeys(base)).replace(`${JSON.stringify(KEY_MARK)}:1`, PROTO_KEYS),
  });
  for (const { path, value } of nodes(base)) {
    // A prototype name is a valid string in most fields, so like a plain number a 400 may name a partner field.
    if (typeof value === "string") HOSTILE_STRINGS.forEach((s) => add(path, JSON.stringify(s), s, s !== NUL));
    if (typeof value === "number") HOSTILE_NUMBERS.forEach((n) => add(path, String(n), n, n > 1e-300 && n < 1e300));
    if (typeof value !== "string") add(path, "NUL string", NUL);
    if (value && typeof value === "object" && !Array.isArray(value))
      add(path, "extra keys __proto__, constructor and NUL", withKeys(value));
    add(path, `nested ${DEEP_LEVELS} deep`, DEEP_MARK);
  }
  return out;
}

/** Does a 4xx body name the field at `path` (the field itself, an enclosing field, or a field inside it)? */
export function namesField(fields: Record<string, string> | undefined, path: Path): boolean {
  if (!fields) return false;
  if (!path.length) return Object.keys(fields).length > 0;
  const p = path.join(".");
  return Object.keys(fields).some((k) => k === p || p.startsWith(`${k}.`) || k.startsWith(`${p}.`));
}
