import type { ConsumerReading } from "../types";
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
 * How huggingface/transformers 4.x reads `rope_scaling` (src/transformers/modeling_rope_utils.py). Two rule sets:
 * - "early": the 4.4x line, read at commits 0044e3b and ef46806 (the latter on the 4.45 line): yarn builds its ramp
 *   from `max_position_embeddings`, always floors/ceils the ramp ends, knows no `mscale`/`mscale_all_dim`/`truncate`
 *   and takes the attention factor from `attention_factor` or 0.1·ln(factor) + 1; longrope reads the original length
 *   only from a top-level `original_max_position_embeddings`. The rotary dim is `head_dim` when the config has one,
 *   else hidden_size // num_attention_heads: ef46806 reads head_dim (transformers PR #32495, after 4.44), 0044e3b
 *   did not (docs/export-targets.md, "head_dim in the 4.4x line").
 * - "v4": 4.55 onward (the gpt-oss release, which added `truncate`): yarn reads `original_max_position_embeddings`
 *   from the block and then uses factor = max_position_embeddings / original (the DeepSeek-V3 rule, 4.51+),
 *   `mscale`/`mscale_all_dim` give the attention factor, `truncate` (default true) rounds the ramp ends; head_dim as
 *   in "early". Longrope still reads the top-level original length.
 * Which release introduced which rule is in docs/export-targets.md with its sources.
 */
export type V4Rules = "early" | "v4";

export function readV4(view: ConfigView, rules: V4Rules, runningLength?: number): ConsumerReading {
  const { cfg } = view;
  const warnings: string[] = [];
  const base = num(cfg.rope_theta) ?? 10000; // the config classes' default rope_theta (LlamaConfig: 10000.0)
  const heads = num(cfg.num_attention_heads) ?? 1;
  const hidden = num(cfg.hidden_size) ?? 0;
  // getattr(config, "head_dim", hidden_size // num_attention_heads) in every `_compute_*` function from 4.45 on
  // (modeling_rope_utils.py at ef46806; transformers PR #32495). A head_dim of null is not modelled (4.45 would fail).
  const headDim = num(cfg.head_dim) ?? Math.floor(hidden / heads);
  const d = rotaryDimension(headDim, num(cfg.partial_rotary_factor) ?? 1);
  const maxPos = num(cfg.max_position_embeddings) ?? 2048;
  const rs: Obj | null = isObj(cfg.rope_scaling) ? cfg.rope_scaling : null;
  const plain = (method: string, b = base): ConsumerReading => ({
    rotaryDim: d,
    base: b,
    originalLength: null,
    method,
    invFreq: plainInvFreq(d, b),
    attentionFactor: 1,
    warnings,
  });
  if (!rs) return plain("default");

  // BC: "rope_type" was "type" (PretrainedConfig keeps reading the old key).
  const ropeType = multimodalType(rs) ?? String(rs.rope_type ?? rs.type ?? "default");
  validateV4(view, rs, ropeType, rules, d, maxPos, warnings);
  const f = (key: string) => num(rs[key]);
  const seqLen = runningLength ?? maxPos;

  switch (ropeType) {
    case "default":
      return plain("default");
    case "linear":
      return { ...plain("linear"), invFreq: plainInvFreq(d, base).map((x) => x / f("factor")!) };
    case "dynamic": {
      const r = dynamicInvFreq(d, base, f("factor")!, maxPos, seqLen);
      return { ...plain("dynamic"), originalLength: maxPos, invFreq: r.invFreq };
    }
    case "yarn":
      return readYarn(rs, rules, d, base, maxPos, warnings);
    case "longrope": {
      const topOriginal = num(cfg.original_max_position_embeddings);
      const original = topOriginal ?? maxPos;
      const factor = topOriginal !== undefined ? maxPos / topOriginal : f("factor")!;
      // 4.45 picks the set at init from expanded (= original·factor) > original; later lines switch on the running
      // length against the same original length (dynamic_rope_update's longrope branch): the same set at the target.
      const expanded = topOriginal !== undefined ? maxPos : maxPos * factor;
      const useLong = rules === "early" ? expanded > original : seqLen > original;
      const ext = (useLong ? rs.long_factor : rs.short_factor) as number[];
      const r = longropeReading(d, base, ext, factor, original, f("attention_factor"), RULES.longropeLength);
      return { ...plain("longrope"), originalLength: original, ...r };
    }
    case "llama3": {
      const old = f("original_max_position_embeddings")!;
      const [low, high] = [f("low_freq_factor")!, f("high_freq_factor")!];
      const inv = llama3InvFreq(d, base, f("factor")!, low, high, old, RULES.llama3EqualFactors);
      return { ...plain("llama3"), originalLength: old, invFreq: inv };
    }
    default:
      throw new Error(`rope_type "${ropeType}" is not in ROPE_INIT_FUNCTIONS`);
  }
}

/**
 * The 4.x multimodal config classes, which the configs carrying `mrope_section` load through, copy a `type` over
 * `rope_type` whenever the block has one, reading "mrope" as "default": huggingface/transformers
 * src/transformers/models/qwen2_vl/configuration_qwen2_vl.py at 4efabc6e (4.4x line), Qwen2VLConfig.__init__. So a
 * block merged onto such a config runs the type of its `type` key, not of its `rope_type`. Undefined for other blocks.
 */
function multimodalType(rs: Obj): string | undefined {
  if (!("mrope_section" in rs) || !("type" in rs)) return undefined;
  return rs.type === "mrope" ? "default" : String(rs.type);
}

function readYarn(rs: Obj, rules: V4Rules, d: number, base: number, maxPos: number, warnings: string[]) {
  let factor = num(rs.factor)!;
  let original = maxPos;
  let attention = num(rs.attention_factor);
  let truncate = true;
  if (rules === "v4") {
    const blockOriginal = num(rs.original_max_position_embeddings);
    if (blockOriginal !== undefined) [original, factor] = [blockOriginal, maxPos / blockOriginal];
    const [m, mAll] = [num(rs.mscale), num(rs.mscale_all_dim)];
    if (attention === undefined)
      attention = m && mAll ? yarnMscale(factor, m) / yarnMscale(factor, mAll) : yarnMscale(factor);
    truncate = rs.truncate === undefined ? true : Boolean(rs.truncate);
  } else {
    attention ??= yarnMscale(factor, 1, false);
  }
  const betaFast = num(rs.beta_fast) || 32; // `or 32`: 0 and null fall back too
  const betaSlow = num(rs.beta_slow) || 1;
  return {
    rotaryDim: d,
    base,
    originalLength: original,
    method: "yarn",
    invFreq: yarnInvFreq({ d, base, factor, original, betaFast, betaSlow, truncate }),
    attentionFactor: attention,
    warnings,
  };
}

/** Keys each `_validate_<type>_parameters` accepts besides the required ones (unknown keys draw a warning). */
const KEYS: Record<V4Rules, Record<string, { required: string[]; optional: string[] }>> = {
  early: {
    default: { required: ["rope_type"], optional: [] },
    linear: { required: ["rope_type", "factor"], optional: [] },
    dynamic: { required: ["rope_type", "factor"], optional: ["original_max_position_embeddings"] },
    yarn: { required: ["rope_type", "factor"], optional: ["attention_factor", "beta_fast", "beta_slow"] },
    longrope: {
      required: ["rope_type", "short_factor", "long_factor"],
      optional: ["attention_factor", "factor", "original_max_position_embeddings"],
    },
    llama3: {
      required: ["rope_type", "factor", "original_max_position_embeddings", "low_freq_factor", "high_freq_factor"],
      optional: [],
    },
  },
  v4: {
    default: { required: ["rope_type"], optional: [] },
    linear: { required: ["rope_type", "factor"], optional: [] },
    dynamic: { required: ["rope_type", "factor"], optional: ["original_max_position_embeddings"] },
    // original_max_position_embeddings: transformers PR #36877 (4.51); mscale, mscale_all_dim: the DeepSeek-V3
    // addition; truncate: the gpt-oss addition (4.55; from memory, see docs/export-targets.md).
    yarn: {
      required: ["rope_type", "factor"],
      optional: [
        "attention_factor",
        "beta_fast",
        "beta_slow",
        "original_max_position_embeddings",
        "mscale",
        "mscale_all_dim",
        "truncate",
      ],
    },
    longrope: {
      required: ["rope_type", "short_factor", "long_factor"],
      optional: ["attention_factor", "factor", "original_max_position_embeddings"],
    },
    llama3: {
      required: ["rope_type", "factor", "original_max_position_embeddings", "low_freq_factor", "high_freq_factor"],
      optional: [],
    },
  },
};

/** `rope_config_validation` and the per-type validators: what they log (warnings) or raise (thrown here). */
function validateV4(view: ConfigView, rs: Obj, type: string, rules: V4Rules, d: number, maxPos: number, out: string[]) {
  const spec = KEYS[rules][type];
  if (!spec) {
    out.push(`Missing validation function mapping in ROPE_VALIDATION_FUNCTIONS for 'rope_type'='${type}'`);
    return;
  }
  const received = new Set(Object.keys(rs));
  if (!received.has("rope_type") && received.delete("type")) received.add("rope_type");
  // The multimodal config classes validate with ignore_keys={"mrope_section"} (…, "mrope_interleaved" in the qwen3
  // line): models/qwen2_vl/configuration_qwen2_vl.py, v4.4x line, read through stored copies.
  for (const k of MROPE_KEYS) received.delete(k);
  const missing = spec.required.filter((k) => !received.has(k));
  if (missing.length) throw new Error(`KeyError: Missing required keys in rope_scaling for '${type}': ${missing}`);
  const unused = [...received].filter((k) => !spec.required.includes(k) && !spec.optional.includes(k));
  if (unused.length) out.push(`Unrecognized keys in rope_scaling for 'rope_type'='${type}': ${unused.join(", ")}`);

  const isFloat = (key: string) => view.pyType(["rope_scaling", key]) === "float";
  const factor = num(rs.factor);
  const factorRule = () => {
    if (factor === undefined || !isFloat("factor") || factor < 1)
      out.push(`rope_scaling's factor field must be a float >= 1, got ${factor}`);
  };
  if (["linear", "dynamic", "yarn", "llama3"].includes(type)) factorRule();
  if (type === "yarn") {
    const a = num(rs.attention_factor);
    if (rs.attention_factor != null && (!isFloat("attention_factor") || a! < 0)) {
      out.push(`rope_scaling's attention_factor field must be a float greater than 0, got ${a}`);
    }
    for (const k of ["beta_fast", "beta_slow"]) {
      if (rs[k] != null && !isFloat(k)) out.push(`rope_scaling's ${k} field must be a float, got ${String(rs[k])}`);
    }
    if ((num(rs.beta_fast) || 32) < (num(rs.beta_slow) || 1))
      out.push("rope_scaling's beta_fast field must be greater than beta_slow");
  }
  if (type === "longrope") {
    for (const k of ["short_factor", "long_factor"]) {
      const list = rs[k];
      if (!Array.isArray(list) || list.some((x) => typeof x !== "number"))
        out.push(`rope_scaling's ${k} field must be a list of numbers`);
      else if (list.length !== Math.floor(d / 2))
        out.push(`rope_scaling's ${k} field must have length ${Math.floor(d / 2)}, got ${list.length}`);
    }
    if (num(view.cfg.original_max_position_embeddings) !== undefined) {
      out.push(
        "This model has set a original_max_position_embeddings field ... Please set the factor field of rope_scaling with this ratio instead",
      );
    } else {
      if (factor === undefined) out.push("Missing required keys in rope_scaling: 'factor'");
      else if (!isFloat("factor") || factor < 1)
        out.push(`rope_scaling's factor field must be a float >= 1, got ${factor}`);
      const a = num(rs.attention_factor);
      if (a !== undefined && (!isFloat("attention_factor") || a < 0))
        out.push(`rope_scaling's attention_factor field must be a float greater than 0, got ${a}`);
    }
  }
  if (type === "llama3") {
    for (const k of ["low_freq_factor", "high_freq_factor"]) {
      if (rs[k] == null || !isFloat(k)) out.push(`rope_scaling's ${k} field must be a float, got ${String(rs[k])}`);
    }
    if (num(rs.high_freq_factor)! <= num(rs.low_freq_factor)!)
      out.push("rope_scaling's high_freq_factor field must be greater than low_freq_factor");
    const old = num(rs.original_max_position_embeddings);
    if (old === undefined || view.pyType(["rope_scaling", "original_max_position_embeddings"]) !== "int") {
      out.push(`rope_scaling's original_max_position_embeddings field must be an integer, got ${old}`);
    }
    if (old !== undefined && old >= maxPos)
      out.push("rope_scaling's original_max_position_embeddings field must be less than max_position_embeddings");
  }
}
