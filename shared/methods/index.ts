import type { z } from "zod";
import { METHOD_CATALOG } from "./catalog";
import type { FieldContext, MethodEntry, ParamField } from "./entry";

export { LLAMA3_DEFAULTS, METHOD_CATALOG, YARN_DEFAULTS } from "./catalog";
export { COMMON_SCALING_KEYS, type FieldContext, type MethodEntry, type ParamField, type ParamKind } from "./entry";
export { yarnMscale } from "./params";

type Catalog = typeof METHOD_CATALOG;
export type MethodId = keyof Catalog;
/** Catalog order: the order of every method picker. */
export const METHOD_IDS = Object.keys(METHOD_CATALOG) as [MethodId, ...MethodId[]];

/** Any entry, with its parameter keys widened to string: what generic code (forms, lookups) iterates over. */
export type AnyMethodEntry = MethodEntry<MethodId, z.ZodObject, string | null>;
export const methodEntry = (id: MethodId): AnyMethodEntry => METHOD_CATALOG[id] as unknown as AnyMethodEntry;

type MethodSchema = Catalog[MethodId]["schema"];
/** The request members, in catalog order; methodParamsSchema is their discriminated union. */
export const METHOD_SCHEMAS = METHOD_IDS.map((id) => METHOD_CATALOG[id].schema) as [MethodSchema, ...MethodSchema[]];

export type ExportRopeType = NonNullable<Catalog[MethodId]["exportType"]>;
/** The rope_type values an export may write (the enum of ropeScalingBlockSchema). */
export const EXPORT_ROPE_TYPES = METHOD_IDS.flatMap((id) => {
  const t = METHOD_CATALOG[id].exportType;
  return t === null ? [] : [t];
}) as [ExportRopeType, ...ExportRopeType[]];

/** Methods whose factor defaults to L′/L and that only make sense when the target exceeds the trained length. */
export const METHODS_NEEDING_EXTENSION: readonly MethodId[] = METHOD_IDS.filter((id) => METHOD_CATALOG[id].extends);

// Look-ups by strings that come from users or files go through Maps, so "constructor" or "__proto__" find nothing.
const BY_ID = new Map<string, AnyMethodEntry>(METHOD_IDS.map((id) => [id, methodEntry(id)]));
const BY_ROPE_TYPE = new Map<string, AnyMethodEntry>(
  METHOD_IDS.flatMap((id) => methodEntry(id).ropeTypes.map((t) => [t, methodEntry(id)] as const)),
);

/** The entry for a method id typed by someone (a URL, a stored plan), or undefined. */
export const findMethod = (id: string): AnyMethodEntry | undefined => BY_ID.get(id);
/** The method a config's rope_type (current or older spelling) names, or undefined. */
export const methodForRopeType = (ropeType: string): AnyMethodEntry | undefined => BY_ROPE_TYPE.get(ropeType);
export const isMethodId = (id: string): id is MethodId => BY_ID.has(id);

const sixDigits = (x: number) => String(Number(x.toPrecision(6)));
/**
 * A field's default as both forms show it: the engine's value for what the form knows (six significant digits,
 * "yes"/"no" for switches), else the default in words; "" for a required field.
 */
export function defaultText(field: ParamField, c: FieldContext): string {
  const value = field.fallback?.(c);
  if (typeof value === "boolean") return value ? "yes" : "no";
  if (typeof value === "number") return sixDigits(value);
  return field.fallbackText ?? "";
}
