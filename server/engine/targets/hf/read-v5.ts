import type { ConsumerReading } from "../types";
import type { JsonPath } from "../json-text";
import { rotaryDimension, type ConfigView, type Obj } from "./config-view";
import { isObj, num } from "../../../../shared/json-values";
import { MROPE_KEYS } from "../../../../shared/mrope-axes";
import {
  CONSUMER_RULES,
  dynamicInvFreq,
  llama3InvFreq,
  longropeReading,
  plainInvFreq,
  yarnInvFreq,
  yarnMscale,
} from "../consumer-rope";

const RULES = CONSUMER_RULES.transformers;

/**
 * How huggingface/transformers 5.x reads the `rope_parameters` layout (src/transformers/modeling_rope_utils.py,
 * RotaryEmbeddingConfigMixin and the `_compute_*` functions; read in a verbatim copy of the v5 line, see
 * docs/export-targets.md):
 * - config.json's `rope_scaling`, when present and non-empty, replaces `rope_parameters` wholesale;
 * - `rope_theta` is set *by default only* into each parameter dict, from a top-level `rope_theta` or else the class
 *   default 10 000: a patch that changes only the top level leaves an existing inner `rope_theta` in force, and a
 *   block without one falls back to 10 000 when the config has moved its base inside (the lost base);
 * - the dict is nested when its keys are the config's `layer_types`; each nested dict is read on its own;
 * - yarn/longrope/llama3 get `original_max_position_embeddings` by default from `max_position_embeddings`, except that
 *   a flat config with a top-level `original_max_position_embeddings` has it forced from there;
 * - yarn takes `factor` from the dict (falling back to max_position_embeddings / original only when unset), the ramp
 *   from the original length, the attention factor from attention_factor, else mscale/mscale_all_dim, else g(s).
 */
export function readV5(view: ConfigView, runningLength?: number): ConsumerReading {
  const { cfg } = view;
  const warnings: string[] = [];
  const source: Obj =
    isObj(cfg.rope_scaling) && Object.keys(cfg.rope_scaling).length
      ? cfg.rope_scaling
      : isObj(cfg.rope_parameters)
        ? cfg.rope_parameters
        : {};
  const sourceKey = source === cfg.rope_scaling ? "rope_scaling" : "rope_parameters";
  const topTheta = num(cfg.rope_theta) ?? 10000; // RotaryEmbeddingConfigMixin.default_theta
  const layerTypes = Array.isArray(cfg.layer_types) ? cfg.layer_types.map(String) : [];
  const nestedKeys = Object.keys(source).filter((k) => layerTypes.includes(k));
  const groups: [string | null, Obj][] = nestedKeys.length
    ? nestedKeys.filter((k) => isObj(source[k])).map((k) => [k, { ...(source[k] as Obj) }])
    : [[null, { ...source }]];
  const maxPos = num(cfg.max_position_embeddings) ?? 2048;
  const readings = groups.map(([layerType, dict]) => {
    dict.rope_theta ??= topTheta;
    dict.rope_type ??= dict.type ?? "default";
    if (cfg.partial_rotary_factor !== undefined) dict.partial_rotary_factor ??= cfg.partial_rotary_factor;
    if (["llama3", "yarn", "longrope"].includes(String(dict.rope_type))) {
      const top = num(cfg.original_max_position_embeddings);
      if (layerType === null && top !== undefined) dict.original_max_position_embeddings = top;
      else dict.original_max_position_embeddings ??= maxPos;
    }
    const path: JsonPath = layerType === null ? [sourceKey] : [sourceKey, layerType];
    validateV5(view, dict, path, cfg.partial_rotary_factor !== undefined, warnings);
    return readGroup(cfg, dict, maxPos, runningLength ?? maxPos, warnings);
  });
  // The plan scales the full-attention layers (issue 11); other layer types are read too and reported beside it, so
  // a check can see that they kept their trained frequencies.
  const scaled = Math.max(
    0,
    groups.findIndex(([t]) => t === "full_attention"),
  );
  const reading = readings[scaled];
  if (groups.length > 1)
    reading.layerGroups = groups.map(([t], i) => ({
      layerType: t!,
      base: readings[i].base,
      method: readings[i].method,
      invFreq: readings[i].invFreq,
      attentionFactor: readings[i].attentionFactor,
    }));
  return reading;
}

function readGroup(cfg: Obj, dict: Obj, maxPos: number, seqLen: number, warnings: string[]): ConsumerReading {
  const base = num(dict.rope_theta)!;
  const headDim = num(cfg.head_dim) ?? Math.floor((num(cfg.hidden_size) ?? 0) / (num(cfg.num_attention_heads) ?? 1));
  const d = rotaryDimension(headDim, num(dict.partial_rotary_factor) ?? 1);
  const type = String(dict.rope_type);
  const f = (k: string) => num(dict[k]);
  const r = (
    method: string,
    invFreq = plainInvFreq(d, base),
    attentionFactor = 1,
    originalLength: number | null = null,
  ): ConsumerReading => ({
    rotaryDim: d,
    base,
    originalLength,
    method,
    invFreq,
    attentionFactor,
    warnings,
  });
  const original = f("original_max_position_embeddings") ?? maxPos;
  switch (type) {
    case "default":
      return r("default");
    case "linear":
      return r(
        "linear",
        plainInvFreq(d, base).map((x) => x / f("factor")!),
      );
    case "dynamic":
      return r("dynamic", dynamicInvFreq(d, base, f("factor")!, maxPos, seqLen).invFreq, 1, maxPos);
    case "yarn": {
      const factor = f("factor") ?? maxPos / original;
      const [m, mAll] = [f("mscale"), f("mscale_all_dim")];
      const a =
        f("attention_factor") ?? (m && mAll ? yarnMscale(factor, m) / yarnMscale(factor, mAll) : yarnMscale(factor));
      const truncate = dict.truncate === undefined ? true : Boolean(dict.truncate);
      const inv = yarnInvFreq({
        d,
        base,
        factor,
        original,
        betaFast: f("beta_fast") || 32,
        betaSlow: f("beta_slow") || 1,
        truncate,
      });
      return r("yarn", inv, a, original);
    }
    case "longrope": {
      const factor = f("factor") ?? maxPos / original;
      const ext = (seqLen > original ? dict.long_factor : dict.short_factor) as number[];
      const lr = longropeReading(d, base, ext, factor, original, f("attention_factor"), RULES.longropeLength);
      return r("longrope", lr.invFreq, lr.attentionFactor, original);
    }
    case "llama3":
      return r(
        "llama3",
        llama3InvFreq(
          d,
          base,
          f("factor")!,
          f("low_freq_factor")!,
          f("high_freq_factor")!,
          original,
          RULES.llama3EqualFactors,
        ),
        1,
        original,
      );
    default:
      throw new Error(`rope_type "${type}" is not in ROPE_INIT_FUNCTIONS`);
  }
}

const KEYS: Record<string, { required: string[]; optional: string[] }> = {
  default: { required: ["rope_type"], optional: ["rope_theta"] },
  linear: { required: ["rope_type", "factor"], optional: ["rope_theta"] },
  dynamic: { required: ["rope_type", "factor"], optional: ["rope_theta"] },
  yarn: {
    required: ["rope_type", "factor", "original_max_position_embeddings"],
    optional: ["rope_theta", "attention_factor", "beta_fast", "beta_slow", "mscale", "mscale_all_dim", "truncate"],
  },
  longrope: {
    required: ["rope_type", "short_factor", "long_factor", "original_max_position_embeddings"],
    optional: ["rope_theta", "attention_factor", "factor"],
  },
  llama3: {
    required: ["rope_type", "factor", "original_max_position_embeddings", "low_freq_factor", "high_freq_factor"],
    optional: ["rope_theta"],
  },
};

/** `validate_rope` and `_validate_<type>_rope_parameters` (v5): ints are accepted where 4.x wanted floats, except attention_factor. */
function validateV5(view: ConfigView, dict: Obj, path: JsonPath, ignorePartial: boolean, out: string[]) {
  const type = String(dict.rope_type);
  const spec = KEYS[type];
  if (!spec) {
    out.push(`Missing validation function in 'RotaryEmbeddingConfigMixin' for 'rope_type'='${type}'`);
    return;
  }
  const received = new Set(Object.keys(dict));
  if (received.delete("type")) received.add("rope_type");
  // Multimodal section keys are the model's, ignored by its config class's validation (see read-v4.ts).
  for (const k of MROPE_KEYS) received.delete(k);
  if (ignorePartial) received.delete("partial_rotary_factor");
  const missing = spec.required.filter((k) => !received.has(k));
  if (missing.length) throw new Error(`KeyError: Missing required keys in rope_parameters for '${type}': ${missing}`);
  const unused = [...received].filter((k) => !spec.required.includes(k) && !spec.optional.includes(k));
  if (unused.length) out.push(`Unrecognized keys in rope_parameters for 'rope_type'='${type}': ${unused.join(", ")}`);
  const factor = num(dict.factor);
  if (["linear", "dynamic", "yarn", "llama3"].includes(type) && (factor === undefined || factor < 1)) {
    out.push(`rope_parameters's factor field must be a float or int >= 1, got ${factor}`);
  }
  if (
    dict.attention_factor != null &&
    (view.pyType([...path, "attention_factor"]) !== "float" || num(dict.attention_factor)! < 0)
  ) {
    out.push(
      `rope_parameters's attention_factor field must be a float greater than 0, got ${String(dict.attention_factor)}`,
    );
  }
  if (type === "yarn") {
    if ((num(dict.beta_fast) || 32) < (num(dict.beta_slow) || 1))
      out.push("rope_parameters's beta_fast field must be greater than beta_slow");
    const implicit = (num(view.cfg.max_position_embeddings) ?? 0) / num(dict.original_max_position_embeddings)!;
    if (implicit !== factor && implicit !== 1) {
      out.push(
        `The explicitly set RoPE scaling factor (${factor}) does not match max_position_embeddings / original_max_position_embeddings = ${implicit}`,
      );
    }
  }
}
