import type { JsonPath } from "./json-text";

/**
 * Keys the open model library's validators type as float (`isinstance(x, float)` in the 4.x validators; v5 still
 * requires it for attention_factor), written with a decimal point (`"factor": 8.0`) so that json.load hands the
 * consumer a float, as a config.json written by the library itself would. Lengths stay integers.
 */
export const CONFIG_FLOAT_KEYS: ReadonlySet<string> = new Set([
  "factor",
  "attention_factor",
  "beta_fast",
  "beta_slow",
  "mscale",
  "mscale_all_dim",
  "low_freq_factor",
  "high_freq_factor",
  "rope_theta",
  "long_factor",
  "short_factor",
  "partial_rotary_factor",
]);

/**
 * The Python serving engines read the same keys plus one of their own: SGLang's yarn block takes its magnitude from
 * `attn_factor` (sgl-project/sglang python/sglang/srt/layers/rotary_embedding/factory.py, eb047c1, passes it to
 * rotary_embedding/yarn.py, 8448045, as a float). The library has no such key, so config patches never write it.
 */
export const ENGINE_FLOAT_KEYS: ReadonlySet<string> = new Set([...CONFIG_FLOAT_KEYS, "attn_factor"]);

/** The key that types a value: the last key on its path (array items are typed by the key that holds the array). */
export const lastKey = (path: JsonPath): string | undefined =>
  [...path].reverse().find((p): p is string => typeof p === "string");

/** A path test for writeJsonText: does the value at `path` sit under one of `keys`? */
export const floatKeyTest = (keys: ReadonlySet<string>) => (path: JsonPath) => keys.has(lastKey(path) ?? "");
