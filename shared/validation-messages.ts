import { z } from "zod";

/*
 * Validation messages in our own words: one plain sentence that names the field ("Title is required.", "Steps of
 * stage 2 must be at least 1."). zod's own English text ("Too small: expected string to have >=1 characters") never
 * reaches a person. Installed once, globally, below: every parse on either side (the server's 400s, the forms'
 * resolvers, the workbench's checks) speaks this way. Messages a schema sets itself (refinements) are short fragments;
 * `plainSentence` turns those into sentences too, where they leave the server and where a form shows them.
 */

type Key = PropertyKey;

/** Words a field key does not spell out well by itself. */
const LABELS: Record<string, string> = {
  modelId: "model",
  ropeTheta: "base (rope_theta)",
  headDim: "head dimension",
  kvHeads: "key/value heads",
  peakFlops: "peak FLOP/s",
  memoryBytes: "memory",
  email: "e-mail",
  acceleratorId: "accelerator",
  acceptance: "acceptance criteria",
  contentHash: "content hash",
  confirmPassword: "repeated new password",
  bytesPerElement: "bytes per element",
};
/** One entry of a list field, named by position ("stage 2"). */
const SINGULAR: Record<string, string> = {
  stages: "stage",
  methods: "method",
  roles: "role",
  acceptance: "criterion",
  layers: "layer",
  scopes: "scope",
  groups: "group",
  layerGroups: "layer group",
};

/** "targetContext" → "target context", "maxPositionEmbeddings" → "max position embeddings". */
export function humanizeKey(key: string): string {
  if (LABELS[key]) return LABELS[key];
  return key
    .replace(/Id$/, "")
    .replace(/([a-z0-9])([A-Z])/g, "$1 $2")
    .replace(/_/g, " ")
    .toLowerCase();
}

const capitalize = (s: string) => (s ? s[0].toUpperCase() + s.slice(1) : s);

/**
 * The field's name as a person reads it, from its path: ["revision", "stages", 1, "steps"] → "steps of stage 2",
 * ["roles", 0] → "role 1", [] → "the form".
 */
export function fieldLabel(path: readonly Key[]): string {
  const parts = path.filter((p): p is string | number => typeof p === "string" || typeof p === "number");
  if (!parts.length) return "the form";
  const last = parts[parts.length - 1];
  const owner = (i: number): string | undefined => {
    const key = parts[i - 1];
    if (typeof parts[i] !== "number" || typeof key !== "string") return undefined;
    return `${SINGULAR[key] ?? humanizeKey(key)} ${Number(parts[i]) + 1}`;
  };
  if (typeof last === "number") return owner(parts.length - 1) ?? `entry ${last + 1}`;
  const name = humanizeKey(last);
  for (let i = parts.length - 2; i >= 1; i--) {
    const of = owner(i);
    if (of) return `${name} of ${of}`;
  }
  return name;
}

const grouped = new Intl.NumberFormat("en-GB", { maximumFractionDigits: 6 });
const figure = (v: unknown) =>
  typeof v === "number" ? grouped.format(v) : typeof v === "bigint" ? v.toString() : String(v);
const orList = (items: readonly string[]) =>
  items.length <= 1 ? items.join("") : `${items.slice(0, -1).join(", ")} or ${items[items.length - 1]}`;

const KIND: Record<string, string> = {
  number: "a number",
  int: "a whole number",
  string: "text",
  boolean: "yes or no",
  array: "a list",
  object: "a group of values",
  date: "a date",
  bigint: "a whole number",
};

/** The fields of a zod issue this module reads (a raw issue while parsing, or a finished one). */
export type IssueLike = {
  code?: string;
  path?: readonly Key[];
  message?: string;
  input?: unknown;
  expected?: string;
  origin?: string;
  minimum?: unknown;
  maximum?: unknown;
  inclusive?: boolean;
  format?: string;
  divisor?: number;
  values?: readonly unknown[];
  keys?: readonly string[];
  prefix?: string;
  suffix?: string;
  includes?: string;
};

/** One sentence, naming the field, for an issue zod raised by itself. */
export function issueSentence(issue: IssueLike): string {
  const label = fieldLabel(issue.path ?? []);
  const L = capitalize(label);
  const missing = issue.input === undefined || issue.input === null || issue.input === "";
  switch (issue.code) {
    case "invalid_type":
      if (missing) return `${L} is required.`;
      if (issue.expected === "number" || issue.expected === "int") return `${L} must be ${KIND[issue.expected]}.`;
      return `${L} must be ${KIND[issue.expected ?? ""] ?? "of another kind"}.`;
    case "too_small": {
      const n = figure(issue.minimum);
      if (issue.origin === "string")
        return Number(issue.minimum) <= 1 ? `${L} is required.` : `${L} needs at least ${n} characters.`;
      if (issue.origin === "array" || issue.origin === "set")
        return `${L} needs at least ${n} ${Number(issue.minimum) === 1 ? "entry" : "entries"}.`;
      return issue.inclusive === false ? `${L} must be more than ${n}.` : `${L} must be at least ${n}.`;
    }
    case "too_big": {
      const n = figure(issue.maximum);
      if (issue.origin === "string") return `${L} can be at most ${n} characters long.`;
      if (issue.origin === "array" || issue.origin === "set") return `${L} can hold at most ${n} entries.`;
      return issue.inclusive === false ? `${L} must be less than ${n}.` : `${L} must be at most ${n}.`;
    }
    case "invalid_format":
      if (missing) return `${L} is required.`;
      if (issue.format === "email") return `${L} must be an e-mail address, such as name@lab.test.`;
      if (issue.format === "url") return `${L} must be a web address.`;
      if (issue.format === "starts_with") return `${L} must start with "${issue.prefix}".`;
      if (issue.format === "ends_with") return `${L} must end with "${issue.suffix}".`;
      if (issue.format === "includes") return `${L} must contain "${issue.includes}".`;
      if (issue.format === "datetime" || issue.format === "date") return `${L} must be a date.`;
      return `${L} is not in the expected form.`;
    case "not_multiple_of":
      return issue.divisor === 1
        ? `${L} must be a whole number.`
        : `${L} must be a multiple of ${figure(issue.divisor)}.`;
    case "invalid_value": {
      const values = (issue.values ?? []).map((v) => (typeof v === "string" ? `"${v}"` : figure(v)));
      return values.length === 1 ? `${L} must be ${values[0]}.` : `${L} must be one of ${orList(values)}.`;
    }
    case "unrecognized_keys": {
      const keys = (issue.keys ?? []).map((k) => `"${k}"`);
      return `${L} has ${keys.length === 1 ? "a field" : "fields"} we do not accept: ${keys.join(", ")}.`;
    }
    case "invalid_union":
      return missing ? `${L} is required.` : `${L} matches none of the accepted forms.`;
    default:
      return `${L} is not valid.`;
  }
}

/** Fragments schemas write ("cannot exceed attentionHeads") start with one of these: the field's name goes first. */
const PREDICATE =
  /^(must|cannot|can|can't|needs?|is|are|has|have|should|may|exceeds?|expected|lies|falls|does|do|not|only)\b/i;

/**
 * A sentence naming the field for any message about it: our own sentences pass unchanged; a schema's fragment
 * ("cannot exceed attentionHeads", "one of a, b", "retired") gets the field's name and its identifiers spelled out.
 */
export function plainSentence(path: readonly Key[], message: string): string {
  const text = message.trim();
  const label = fieldLabel(path);
  // zod's own wording, should any slip past the global map (a parse given its own locale): say only what is known.
  if (/^(Too (small|big)|Invalid|Unrecognized)\b/.test(text)) return `${capitalize(label)} is not valid.`;
  if (/^[A-Z][^]*[.!?]$/.test(text)) return text;
  const spelled = text.replace(/\b[a-z]+(?:[A-Z][a-z0-9]*)+\b/g, (k) => humanizeKey(k)).replace(/[.;:\s]+$/, "");
  let sentence: string;
  if (/^required\b/i.test(spelled)) sentence = `${label} is ${spelled}`;
  else if (/^one of\b/i.test(spelled)) sentence = `${label} must be ${spelled}`;
  else if (/^at (most|least)\b/i.test(spelled)) sentence = `${label} must be ${spelled}`;
  else if (PREDICATE.test(spelled)) sentence = `${label} ${spelled}`;
  else if (spelled.toLowerCase().includes(label.toLowerCase()) || /^(give|say|pick|enter|add|use)\b/i.test(spelled))
    sentence = spelled;
  else if (/^[\w-]+$/.test(spelled)) sentence = `${label} is ${spelled}`;
  else sentence = `${label}: ${spelled}`;
  return `${capitalize(sentence)}.`;
}

/** A dotted field key as the API sends it ("revision.stages.1.steps") back to a path. */
export const pathOfKey = (key: string): (string | number)[] =>
  key === "(body)" ? [] : key.split(".").map((p) => (/^\d+$/.test(p) ? Number(p) : p));

/** The 400's message: the first few field sentences, so a client that shows only the message still names them. */
export function summarizeFields(fields: Record<string, string>): string {
  const sentences = Object.values(fields);
  const shown = sentences.slice(0, 3).join(" ");
  const more = sentences.length - 3;
  return more > 0 ? `${shown} And ${more} more ${more === 1 ? "value needs" : "values need"} fixing.` : shown;
}

// Installed when this module is first imported (shared/schemas/common.ts imports it, so every schema user has it).
// A schema's own message still wins: zod asks the global map only when the schema and the parse gave none.
z.config({ customError: (issue) => issueSentence(issue as IssueLike) });
