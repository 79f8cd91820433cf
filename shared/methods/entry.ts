import type { z } from "zod";

/** What a form knows when it shows a default: s = L′/L, the target L′ and the pair count d/2 (null while unknown). */
export type FieldContext = { scale: number | null; targetContext: number | null; pairs: number | null };

export type ParamKind = "number" | "integer" | "list" | "boolean";

/** One input of a method's form; `key` is a field of the method's schema, so a renamed parameter is a type error. */
export interface ParamField<Key extends string = string> {
  key: Key;
  label: string;
  kind: ParamKind;
  /** No default: the request is refused without it. */
  required?: boolean;
  hint?: string;
  /** The engine's default for these inputs (placeholders); null while it depends on something not yet known. */
  fallback?: (c: FieldContext) => number | boolean | null;
  /** The default in words, for forms without the inputs `fallback` needs. */
  fallbackText?: string;
  /** Why the default is what it is, shown under the field; uses what the form knows (all null in the plan editor). */
  note?: (c: FieldContext) => string;
}

type ParamKey<S extends z.ZodObject> = Exclude<keyof z.output<S>, "method"> & string;

/**
 * One rotary scaling method: everything the engine, the config import and export, and both forms need to
 * know about it besides its formula (server/engine/methods/<id>.ts).
 */
export interface MethodEntry<
  K extends string = string,
  S extends z.ZodObject = z.ZodObject,
  T extends string | null = string | null,
> {
  id: K;
  /** The name in pickers, legends and reports. */
  label: string;
  /** The name in narrow table cells. */
  short: string;
  /** One line under the picker. */
  summary: string;
  /** How it computes, in our words for "How is this computed?": formulas between backticks, and the work it follows. */
  explanation: { text: string; source: string };
  /** The request member (`method: id` plus its parameters); methodParamsSchema is the union of these. */
  schema: S;
  /** Factor defaults to L′/L, so the target must exceed the trained length. */
  extends: boolean;
  /** The engine's defaults for optional parameters that do not depend on the model. */
  defaults: Partial<Record<ParamKey<S>, number | boolean>>;
  fields: readonly ParamField<ParamKey<S>>[];
  /** rope_type the export writes in rope_scaling; null when the export has no rope_scaling block. */
  exportType: T;
  /** rope_type names a config may carry for this method: the current one first, then older spellings. */
  ropeTypes: readonly string[];
  /** rope_scaling keys loaders read for these rope types, beyond COMMON_SCALING_KEYS. */
  configKeys: readonly string[];
  /** A valid parameter set for a model with `pairs` rotary pairs (tests, and a starting point for forms). */
  example: (pairs: number) => z.output<S>;
}

/** Keeps the literal id and rope_type of an entry, so the catalog can derive the MethodId and rope_type unions. */
export const defineMethod = <const K extends string, S extends z.ZodObject, const T extends string | null>(
  entry: MethodEntry<K, S, T>,
) => entry;

/**
 * Keys every rope_type reads (or that sit in rope_scaling without changing the method): huggingface/transformers,
 * src/transformers/modeling_rope_utils.py, `_check_received_keys` and `rope_config_validation` (read at commit
 * 0044e3b, the v4.45 line: "type" is the older spelling of "rope_type"); rope_theta and partial_rotary_factor
 * appear in rope_scaling / rope_parameters of newer configs (from memory of the v4.5x `rope_parameters` form).
 */
export const COMMON_SCALING_KEYS = [
  "rope_type",
  "type",
  "factor",
  "original_max_position_embeddings",
  "rope_theta",
  "partial_rotary_factor",
] as const;
