import type { CurrentScaling } from "../../../shared/schemas";
import { COMMON_SCALING_KEYS, methodForRopeType } from "../../../shared/methods";
import { ropeScalingKnownKeys, suggestKey } from "./rope-scaling-keys";
import { scalingWarnings } from "./scaling-warnings";
import { num, type Json, type Warn } from "./config-values";
// Multimodal section keys sit in the scaling block of any rope_type (cited in shared/mrope-axes.ts).
import { MROPE_KEYS } from "../../../shared/mrope-axes";

/** rope_scaling keys that place the method rather than parametrise it: left out of the imported parameters. */
const NOT_PARAMETERS: readonly string[] = [...COMMON_SCALING_KEYS.filter((k) => k !== "factor"), ...MROPE_KEYS];

const camel = (k: string) => k.replace(/_([a-z])/g, (_m, c: string) => c.toUpperCase());

/**
 * rope_type names loaders renamed. "mrope" → "default": the same Qwen2-VL config rewrites it before validation
 * ("mrope does default RoPE calculations"). The catalog's older spellings (longrope's "su") are no longer in the
 * loaders' ROPE_INIT_FUNCTIONS (modeling_rope_utils.py, v4.45 line), so a config still using them fails to load.
 */
function currentName(type: string): { name: string; refused: boolean } | undefined {
  if (type === "mrope") return { name: "default", refused: false };
  const entry = methodForRopeType(type);
  const current = entry?.ropeTypes[0];
  return current && current !== type ? { name: current, refused: true } : undefined;
}

const ropeTypeOf = (rs: Json) => {
  const t = String(rs.rope_type ?? rs.type ?? "default");
  return t === "mrope" ? "default" : t;
};

/** A scaling block as a profile's current scaling, without warnings; null when it leaves the frequencies alone. */
export function toCurrentScaling(rs: Json | undefined): CurrentScaling | null {
  if (!rs) return null;
  const type = ropeTypeOf(rs);
  if (type === "default") return null;
  const params: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(rs)) if (!NOT_PARAMETERS.includes(k)) params[camel(k)] = v;
  return { method: methodForRopeType(type)?.id ?? type, params, raw: rs };
}

/**
 * Reads the scaling block the scaled layers use: its method and parameters, the pre-training length it names, and
 * every warning about it. The pre-training length follows the loaders: a top-level original_max_position_embeddings
 * wins over the block's (huggingface/transformers, src/transformers/modeling_rope_utils.py at ef46806,
 * `_compute_longrope_parameters`: "Phi3 … have a original_max_position_embeddings field"; the v5 line's
 * `standardize_rope_params` gives the same priority for llama3, yarn and longrope).
 */
export function readScalingBlock(
  cfg: Json,
  rs: Json,
  maxPos: number,
  latent: boolean,
  warn: Warn,
): { currentScaling: CurrentScaling; original: number | undefined } {
  const rawType = String(rs.rope_type ?? rs.type ?? "default");
  const renamed = currentName(rawType);
  if (renamed) {
    warn(
      "legacy_type_name",
      `rope_type "${rawType}" is an older name; the current name is "${renamed.name}".` +
        (renamed.refused ? " Current loaders no longer accept the old name and fail to load the model." : ""),
      `Write "rope_type": "${renamed.name}" in the config; Ropewalk reads it as ${renamed.name} meanwhile.`,
    );
  }
  const type = ropeTypeOf(rs);
  const top = num(cfg.original_max_position_embeddings);
  const inBlock = num(rs.original_max_position_embeddings);
  if (top !== undefined && inBlock !== undefined && top !== inBlock) {
    warn(
      "original_length_conflict",
      `original_max_position_embeddings is ${top} at the top level but ${inBlock} inside the scaling block; loaders take the top-level ${top}.`,
      `Ropewalk uses ${top} as the pre-training length. Remove or correct the other value so every tool reads the same length.`,
    );
  }
  const original = top ?? inBlock;
  const method = methodForRopeType(type)?.id;
  const known = ropeScalingKnownKeys(type);
  for (const key of Object.keys(rs)) {
    if (known && !known.includes(key) && !(MROPE_KEYS as readonly string[]).includes(key)) {
      const near = suggestKey(key, known);
      warn(
        "unknown_scaling_key",
        `rope_scaling has the key "${key}", which ${type} does not read; loaders ignore it silently.`,
        near
          ? `Did you mean "${near}"? Rename it, or the value you meant to set is not used.`
          : "Remove it, or check the spelling against the method's keys.",
      );
    }
  }
  if (!known)
    warn(
      "unknown_rope_type",
      `rope_type "${type}" is not one Ropewalk knows.`,
      "Analyse with one of the known methods and compare.",
    );
  scalingWarnings(method, type, rs, maxPos, original, latent, warn);
  const params: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(rs)) if (!NOT_PARAMETERS.includes(k)) params[camel(k)] = v;
  return { currentScaling: { method: method ?? type, params, raw: rs }, original };
}
