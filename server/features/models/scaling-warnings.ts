import type { MethodId } from "../../../shared/methods";
import { num, type Warn } from "./config-values";

/**
 * Warnings about an existing rope_scaling block: lengths, factor, cache consistency, attention temperature.
 * `method` is the catalog's reading of `type` (undefined for a rope_type no method answers to).
 */
export function scalingWarnings(
  method: MethodId | undefined,
  type: string,
  rs: Record<string, unknown>,
  maxPos: number,
  original: number | undefined,
  latent: boolean,
  warn: Warn,
) {
  const factor = num(rs.factor);
  if (original === undefined && method !== "default") {
    warn(
      "missing_original_length",
      `rope_scaling (${type}) is present but original_max_position_embeddings is missing, so max_position_embeddings (${maxPos}) may already be the extended length.`,
      factor
        ? `If so, the trained length is about ${Math.round(maxPos / factor)} (= ${maxPos} / factor ${factor}); set that as the trained context, or every band shifts.`
        : "Set the trained context by hand from the model card; using the extended length shifts every band.",
    );
  }
  if (factor !== undefined && original !== undefined && original > 0) {
    const r = maxPos / original;
    if (Math.abs(factor - r) > 1e-9 * r) {
      const rounded = Number.isInteger(factor) && !Number.isInteger(r) && Math.ceil(r) === factor;
      warn(
        rounded ? "factor_rounded" : "factor_mismatch",
        rounded
          ? `factor ${factor} looks rounded up: max_position_embeddings / original_max_position_embeddings is ${r}.`
          : `factor ${factor} differs from max_position_embeddings / original_max_position_embeddings = ${r}.`,
        "Decide which length is true: the factor sets the frequencies, max_position_embeddings only the advertised limit. Make them agree before export.",
      );
    }
  }
  if (method === "dynamic") {
    warn(
      "dynamic_kv_cache",
      "Dynamic scaling changes the base as the sequence grows; keys already in the KV cache were rotated with an older base.",
      "Serve with the cache recomputed when the base changes, or pick a static method for cached generation.",
    );
  }
  if (method === "longrope" && Array.isArray(rs.long_factor) && Array.isArray(rs.short_factor)) {
    warn(
      "factor_switching",
      "Per-dimension factors switch from short to long once a sequence passes the original length; keys cached before the switch were rotated with the other set.",
      "Re-rotate or recompute the cache at the switch, or serve with the long factors only.",
    );
  }
  const hasExplicit = num(rs.attention_factor) !== undefined;
  const hasMscale = num(rs.mscale) !== undefined || num(rs.mscale_all_dim) !== undefined;
  if (hasExplicit && hasMscale) {
    warn(
      "attention_factor_twice",
      "Both attention_factor and mscale / mscale_all_dim are set: two sources for the same temperature.",
      "Keep one. Apply the attention factor once — to cos/sin (logits scale by its square) — and not again in the softmax scale.",
    );
  } else if (method === "yarn" && latent && num(rs.mscale_all_dim)) {
    softmaxTemperature(rs, warn);
  } else if (method === "yarn" && num(rs.mscale) !== undefined && num(rs.mscale) === num(rs.mscale_all_dim)) {
    warn(
      "attention_factor_cancels",
      "mscale equals mscale_all_dim, so the YaRN attention factor cancels to 1: the temperature is applied to neither cos/sin nor the softmax.",
      "If the model was tuned with a temperature, check where your attention code applies it.",
    );
  }
}

/** YaRN's mscale(s, m) = 0.1·m·ln s + 1 (Peng et al. 2023, "YaRN", eq. 22 with the per-model multiplier m; equation number from memory). */
const mscaleOf = (s: number, m: number) => (s <= 1 ? 1 : 0.1 * m * Math.log(s) + 1);

/**
 * Latent-attention models put YaRN's temperature into the softmax scale, not into cos/sin: huggingface/transformers,
 * src/transformers/models/deepseek_v3/modeling_deepseek_v3.py at f5a9ec5, DeepseekV3Attention.__init__:
 * `scaling = qk_head_dim^-0.5 · mscale(factor, mscale_all_dim)²`; cos/sin carry mscale(s, mscale) / mscale(s,
 * mscale_all_dim) (the yarn initialiser in modeling_rope_utils.py, from memory of the v4.5x line), which is 1 when
 * the two are equal.
 */
function softmaxTemperature(rs: Record<string, unknown>, warn: Warn) {
  const s = num(rs.factor) ?? 1;
  const all = num(rs.mscale_all_dim)!;
  const m = mscaleOf(s, all);
  // With both multipliers the initialiser divides them; with mscale_all_dim alone cos/sin get the plain mscale(s, 1).
  const mscale = num(rs.mscale);
  const cosSin = mscale ? mscaleOf(s, mscale) / m : mscaleOf(s, 1);
  warn(
    "softmax_temperature",
    `This latent-attention model applies the YaRN temperature in the softmax scale: 1/√d_qk is multiplied by mscale(${s}, mscale_all_dim ${all})² = ${(m * m).toFixed(4)}, ` +
      `while cos/sin carry ${cosSin.toFixed(4)}${cosSin === 1 ? " (mscale equals mscale_all_dim, so nothing)" : ""}.`,
    "Keep the temperature in the attention's softmax scale when you serve or export; do not also fold it into cos/sin, or the logits are sharpened twice.",
  );
}
