/**
 * JSON text as Python's json module sees it: a number written without "." or exponent is an int, anything else a
 * float. JavaScript numbers lose that difference, and the open model library's validators warn when a key typed float
 * arrives as an int (docs/export-targets.md), so the writer takes the list of float-typed keys and the reader's
 * parser remembers which numbers were written as ints.
 */
export type JsonPath = readonly (string | number)[];
/** JSON Pointer (RFC 6901) of a path: how parse results name the numbers that were written as ints. */
export const pointer = (path: JsonPath) =>
  path.map((p) => "/" + String(p).replaceAll("~", "~0").replaceAll("/", "~1")).join("");

/** A finite number as Python's json.dumps writes a float: always with a "." or an exponent ("8.0", "1e+21"). */
export function floatText(n: number): string {
  if (!Number.isFinite(n)) throw new RangeError(`JSON has no ${n}`);
  const s = JSON.stringify(n);
  return /[.eE]/.test(s) ? s : `${s}.0`;
}

/**
 * JSON.stringify(value, null, 2) plus a final newline (or, `compact`, JSON.stringify(value) as one line without it),
 * except that numbers at paths where `isFloat(path)` holds keep a decimal point. Keys keep their insertion order.
 */
export function writeJsonText(
  value: unknown,
  isFloat: (path: JsonPath) => boolean,
  { compact = false }: { compact?: boolean } = {},
): string {
  const [nl, colon] = compact ? ["", ":"] : ["\n", ": "];
  const write = (v: unknown, path: (string | number)[], indent: string): string => {
    if (typeof v === "number") return isFloat(path) ? floatText(v) : JSON.stringify(v);
    if (v === null || typeof v !== "object") return JSON.stringify(v);
    const inner = compact ? "" : indent + "  ";
    const block = (open: string, items: string[], close: string) =>
      items.length === 0
        ? open + close
        : `${open}${nl}${items.map((x) => inner + x).join("," + nl)}${nl}${indent}${close}`;
    if (Array.isArray(v))
      return block(
        "[",
        v.map((x, i) => write(x, [...path, i], inner)),
        "]",
      );
    const entries = Object.entries(v).filter(([, x]) => x !== undefined);
    return block(
      "{",
      entries.map(([k, x]) => `${JSON.stringify(k)}${colon}${write(x, [...path, k], inner)}`),
      "}",
    );
  };
  return write(value, [], "") + (compact ? "" : "\n");
}

/** The parsed value and the JSON Pointers of every number that was written as an int. */
export interface TypedJson {
  value: unknown;
  intPaths: Set<string>;
}

/**
 * A small recursive-descent JSON parser (RFC 8259 grammar) that records int-written numbers. Strings and numbers are
 * lexed by regular expressions and decoded by JSON.parse, so escapes and number syntax follow the standard parser.
 */
export function parseJsonTyped(text: string): TypedJson {
  const intPaths = new Set<string>();
  let at = 0;
  const ws = () => {
    while (at < text.length && " \t\n\r".includes(text[at])) at++;
  };
  const fail = (what: string): never => {
    throw new SyntaxError(`JSON: expected ${what} at offset ${at}`);
  };
  const lex = (re: RegExp, what: string) => {
    re.lastIndex = at;
    const m = re.exec(text);
    if (!m) return fail(what);
    at += m[0].length;
    return m[0];
  };
  const STRING = /"(?:[^"\\\u0000-\u001f]|\\(?:["\\/bfnrt]|u[0-9a-fA-F]{4}))*"/y;
  const NUMBER = /-?(?:0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?/y;
  const value = (path: (string | number)[]): unknown => {
    ws();
    const c = text[at];
    if (c === "{") {
      at++;
      const out: Record<string, unknown> = {};
      ws();
      if (text[at] === "}") return (at++, out);
      for (;;) {
        ws();
        const key = JSON.parse(lex(STRING, "a key")) as string;
        ws();
        if (text[at++] !== ":") fail('":"');
        out[key] = value([...path, key]);
        ws();
        const sep = text[at++];
        if (sep === "}") return out;
        if (sep !== ",") fail('"," or "}"');
      }
    }
    if (c === "[") {
      at++;
      const out: unknown[] = [];
      ws();
      if (text[at] === "]") return (at++, out);
      for (;;) {
        out.push(value([...path, out.length]));
        ws();
        const sep = text[at++];
        if (sep === "]") return out;
        if (sep !== ",") fail('"," or "]"');
      }
    }
    if (c === '"') return JSON.parse(lex(STRING, "a string")) as string;
    for (const [word, v] of [
      ["true", true],
      ["false", false],
      ["null", null],
    ] as const) {
      if (text.startsWith(word, at)) return ((at += word.length), v);
    }
    const num = lex(NUMBER, "a value");
    if (!/[.eE]/.test(num)) intPaths.add(pointer(path));
    return Number(num);
  };
  const result = value([]);
  ws();
  if (at !== text.length) fail("the end of the text");
  return { value: result, intPaths };
}
