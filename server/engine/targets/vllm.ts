import type { CompileInput, CompileResult, ConsumerReading, ExportTarget, TargetArtifact } from "./types";
import { explicitYarnAttention, factorOf, headSize, paramsOf, resolvePlan } from "./engines/plan-facts";
import { numberOr } from "../../../shared/json-values";
import { blockSections, sectionKeysOf } from "../../../shared/mrope-axes";
import { argsOf, compactJson, flagValue, launchArtifact, parseJsonArgument } from "./engines/launch-text";
import { derivedMaxModelLen, vllmRopeParameters } from "./engines/vllm-config";
import { unsectionedTypeRefusal } from "./engines/multimodal-types";
import {
  CONSUMER_RULES,
  llama3InvFreq,
  longropeReading,
  plainInvFreq,
  staticDynamicBase,
  yarnInvFreq,
  yarnMscale,
} from "./consumer-rope";

const RULES = CONSUMER_RULES.vllm;

/**
 * vLLM, read at vllm-project/vllm main (files at the commits named beside each rule; docs/export-targets-engines.md).
 * Artifact: `--hf-overrides <json> --max-model-len <target>`. The overrides carry the block both as `rope_parameters`
 * (what get_rope reads, and the key vLLM's own context-extension example overrides) and as `rope_scaling` (with
 * transformers v4 installed, patch_rope_parameters copies rope_scaling over rope_parameters), plus the top-level
 * rope_theta that v4 installs copy into the block.
 */
function ropeBlock(input: CompileInput): { block: Record<string, unknown>; maxPosition: number } {
  const p = resolvePlan(input);
  const { trained: L, target } = p;
  switch (p.params.method) {
    case "default":
    case "ntk":
    case "base":
      return { block: { rope_type: "default", rope_theta: p.effectiveBase ?? p.base }, maxPosition: target };
    case "linear":
      return { block: { rope_type: "linear", factor: factorOf(p), rope_theta: p.base }, maxPosition: target };
    case "dynamic":
      // get_rope builds dynamic NTK from the model's max_position_embeddings: it must stay the trained length.
      return { block: { rope_type: "dynamic", factor: factorOf(p), rope_theta: p.base }, maxPosition: L };
    case "yarn": {
      const y = paramsOf(p, "yarn");
      const explicit = explicitYarnAttention(p);
      const block: Record<string, unknown> = {
        rope_type: "yarn",
        factor: factorOf(p),
        original_max_position_embeddings: L,
        beta_fast: y.betaFast,
        beta_slow: y.betaSlow,
        truncate: y.truncate,
        rope_theta: p.base,
      };
      // vLLM reads attention_factor (it wins), else the mscale pair: write the plan's own value once.
      if (explicit !== null) block.attention_factor = explicit;
      return { block, maxPosition: target };
    }
    case "llama3": {
      const l3 = paramsOf(p, "llama3");
      return {
        block: {
          rope_type: "llama3",
          factor: factorOf(p),
          low_freq_factor: l3.lowFreqFactor,
          high_freq_factor: l3.highFreqFactor,
          original_max_position_embeddings: L,
          rope_theta: p.base,
        },
        maxPosition: target,
      };
    }
    case "longrope": {
      const lr = paramsOf(p, "longrope");
      return {
        block: {
          rope_type: "longrope",
          long_factor: lr.longFactor,
          short_factor: lr.shortFactor,
          original_max_position_embeddings: L,
          rope_theta: p.base,
        },
        // the magnitude is √(1 + ln(max_position/original)/ln original): max_position must be the target.
        maxPosition: target,
      };
    }
  }
}

/**
 * Rope types get_rope builds a multimodal rotary for when the block carries `mrope_section`: "default" and "yarn"
 * (vllm/model_executor/layers/rotary_embedding/__init__.py at 07b12f1, get_rope). Every other type builds a one-axis
 * rotary and the sections are never read.
 */
const SECTIONED_TYPES = ["default", "yarn"];

/**
 * vLLM's multimodal rotary with YaRN (get_rope at 07b12f1 and 0cd5784: `MRotaryEmbedding(…, original_max_position, …,
 * scaling_factor=factor, …)` when the yarn block has `mrope_section`), read in
 * vllm/model_executor/layers/rotary_embedding/mrope.py at dba39a5 and 055e47c:
 * - it enlarges the length it is given 4× for video positions (`cache_max_position_num = max_position_embeddings * 4`)
 *   and hands that to the base class, which stores it as `max_position_embeddings`;
 * - its frequencies are YaRNScalingRotaryEmbedding's (`_compute_inv_freq` is borrowed, yarn_scaling_rope.py 0cd5784 /
 *   ffdc985), whose ramp ends come from `yarn_find_correction_range(β_fast, β_slow, d, b, self.max_position_embeddings)`
 *   — so the ramp is built from 4 × original_max_position_embeddings, not from the original length;
 * - its magnitude is `yarn_get_mscale(factor) × attn_factor`, multiplied into cos/sin; the class takes no
 *   attention_factor, mscale or mscale_all_dim (at 07b12f1 get_rope forwards only extrapolation_factor, attn_factor,
 *   beta_fast, beta_slow and truncate to it; 0cd5784 also forwards attention_factor and the mscale pair, to a
 *   mrope.py our store does not hold — not followed);
 * - it honours `mrope_interleaved` (apply_interleaved_rope and the triton kernel's interleaved masks) and asserts
 *   `sum(mrope_section) == rotary_dim // 2` at load.
 * The correction dim d·ln(L/(2πβ))/(2·ln b) depends on L/β only (YaRN, Peng et al. 2023, the ramp's definition via
 * r(d) = L/λ_d), so writing β_fast and β_slow times 4 puts the ramp back where the plan has it. The 4 is the fixed
 * factor of the mrope.py we read; 0cd5784's get_rope takes it as `mrope_positions_factor` (default 4) from the model
 * file — a model passing another value is not followed.
 */
export const VLLM_MROPE_POSITIONS_FACTOR = 4;

/** mrope.py (dba39a5, 055e47c) asserts the sections cover every rotating pair; anything else stops vLLM at load. */
function sectionSumProblem(section: number[], d: number): string | null {
  const sum = section.reduce((a, b) => a + b, 0);
  return sum === d / 2
    ? null
    : `vLLM's multimodal rotary asserts sum(mrope_section) == rotary_dim // 2 at load (mrope.py): the sections sum to ${sum}, the model rotates ${d / 2} pairs`;
}

function compile(input: CompileInput): CompileResult {
  const { block, maxPosition } = ropeBlock(input);
  // The overrides replace the whole block, so a model's multimodal sections are written into it (get_rope reads them
  // from rope_parameters; the 4.x-era config keeps them in rope_scaling).
  const sections = sectionKeysOf(input.config.rope_parameters) ?? sectionKeysOf(input.config.rope_scaling);
  if (sections) Object.assign(block, sections);
  const sectioned = sections ? blockSections(block) : null;
  if (sectioned && block.rope_type === "yarn") {
    // The multimodal class builds the ramp from 4 × the original length: β × 4 gives the plan's ramp ends back, and
    // its magnitude is g(s) × attn_factor (VLLM_MROPE_POSITIONS_FACTOR).
    block.beta_fast = (block.beta_fast as number) * VLLM_MROPE_POSITIONS_FACTOR;
    block.beta_slow = (block.beta_slow as number) * VLLM_MROPE_POSITIONS_FACTOR;
    if (typeof block.attention_factor === "number") {
      block.attn_factor = block.attention_factor / yarnMscale(block.factor as number);
    }
  }
  const overrides: Record<string, unknown> = {
    rope_parameters: block,
    rope_scaling: block,
    rope_theta: block.rope_theta,
    max_position_embeddings: maxPosition,
  };
  // transformers-v4 installs copy a top-level original_max_position_embeddings over the block's (config.py).
  if ("original_max_position_embeddings" in input.config && "original_max_position_embeddings" in block) {
    overrides.original_max_position_embeddings = block.original_max_position_embeddings;
  }
  const args = ["--hf-overrides", compactJson(overrides), "--max-model-len", String(input.plan.targetContext)];
  const artifact = launchArtifact('vllm serve "$MODEL"', args, { hfOverrides: overrides });
  const refused = sections && unsectionedTypeRefusal("vLLM", SECTIONED_TYPES, String(block.rope_type), artifact);
  if (refused) return refused;
  const badSum = sectioned && sectionSumProblem(sectioned.section, input.plan.rotaryDim);
  if (badSum) {
    return {
      ok: false,
      cause: badSum,
      // no fallback artifact: any block with these sections stops vLLM at load
      workaround: `correct mrope_section in config.json so it sums to ${input.plan.rotaryDim / 2}, or serve with SGLang or transformers`,
    };
  }
  return { ok: true, artifact };
}

function read(config: Record<string, unknown>, artifact: TargetArtifact): ConsumerReading {
  const args = argsOf(artifact);
  const warnings: string[] = [];
  const overridesText = flagValue(args, "--hf-overrides");
  const { value: overrides, intFloats } = overridesText
    ? parseJsonArgument(overridesText)
    : { value: {}, intFloats: [] };
  for (const p of intFloats) warnings.push(`${p} is written as an integer; transformers' validate_rope wants a float`);
  // get_config: `config.update(hf_overrides_kw)` sets top-level keys, replacing whole values (vllm/transformers_utils/config.py, rope_parameters era; our stored copy names no commit).
  const merged = { ...config, ...overrides };
  const { rp, warnings: patchWarnings } = vllmRopeParameters(merged);
  warnings.push(...patchWarnings);

  const maxModelLenText = flagValue(args, "--max-model-len");
  const derived = derivedMaxModelLen(merged, rp);
  const maxModelLen = maxModelLenText !== undefined ? Number(maxModelLenText) : Math.floor(derived);
  if (maxModelLen > derived) {
    warnings.push(
      `max_model_len ${maxModelLen} is greater than the derived max_model_len ${derived}: vLLM refuses to start unless VLLM_ALLOW_LONG_MAX_MODEL_LEN=1`,
    );
  }

  // get_rope (rotary_embedding/__init__.py, 0cd5784): rope_theta default 10000, rotary dim from rope_dim or head size × partial factor.
  const base = numberOr(rp.rope_theta, 10000);
  const type = typeof rp.rope_type === "string" ? rp.rope_type : "default";
  const partial = numberOr(rp.partial_rotary_factor, 1);
  const d = typeof rp.rope_dim === "number" ? rp.rope_dim : Math.floor(headSize(merged) * partial);
  // Models pass max_position = config.max_position_embeddings to get_rope (vllm/model_executor/models/llama.py).
  const maxPosition = numberOr(merged.max_position_embeddings, 8192);
  const need = (key: string) => {
    if (!(key in rp)) throw new Error(`vLLM's get_rope needs ${key} for rope_type ${type}`);
    return rp[key] as number;
  };
  const reading = (invFreq: number[], attentionFactor: number, originalLength: number | null): ConsumerReading => ({
    rotaryDim: d,
    base,
    originalLength,
    method: type,
    invFreq,
    attentionFactor,
    warnings,
  });
  switch (type) {
    case "default": {
      const mm = blockSections(rp);
      const problem = mm && sectionSumProblem(mm.section, d);
      if (problem) throw new Error(problem);
      return reading(plainInvFreq(d, base), 1, null);
    }
    case "linear":
      // linear_scaling_rope.py (0f17ee0) wraps only a float factor in a list; an int one is iterated and fails.
      if (intFloats.some((p) => p.endsWith("/factor"))) {
        throw new Error("an integer linear factor fails in vLLM's LinearScalingRotaryEmbedding (it wraps only floats)");
      }
      return reading(
        plainInvFreq(d, base).map((t) => t / need("factor")),
        1,
        null,
      );
    case "dynamic":
      return reading(plainInvFreq(d, staticDynamicBase(base, need("factor"), d)), 1, maxPosition);
    case "yarn": {
      const f = need("factor");
      const L = need("original_max_position_embeddings");
      const mm = blockSections(rp);
      if (mm) {
        // The multimodal class (VLLM_MROPE_POSITIONS_FACTOR): ramp from 4 × L, magnitude g(s) × attn_factor only.
        const problem = sectionSumProblem(mm.section, d);
        if (problem) throw new Error(problem);
        const ramp = L * VLLM_MROPE_POSITIONS_FACTOR;
        const inv = yarnInvFreq({
          d,
          base,
          factor: f,
          original: ramp,
          betaFast: numberOr(rp.beta_fast, 32),
          betaSlow: numberOr(rp.beta_slow, 1),
          truncate: rp.truncate !== false,
        });
        return { ...reading(inv, yarnMscale(f) * numberOr(rp.attn_factor, 1), ramp), method: "yarn (multimodal)" };
      }
      const inv = yarnInvFreq({
        d,
        base,
        factor: f,
        original: L,
        betaFast: numberOr(rp.beta_fast, 32),
        betaSlow: numberOr(rp.beta_slow, 1),
        truncate: rp.truncate !== false,
      });
      // yarn_scaling_rope.py (0cd5784): attention_factor wins, else mscale/mscale_all_dim when both are non-zero, else g(s).
      const m = numberOr(rp.mscale, 0);
      const mAll = numberOr(rp.mscale_all_dim, 0);
      const a =
        typeof rp.attention_factor === "number"
          ? rp.attention_factor
          : m && mAll
            ? yarnMscale(f, m) / yarnMscale(f, mAll)
            : yarnMscale(f);
      return reading(inv, a, L);
    }
    case "llama3": {
      const L = need("original_max_position_embeddings");
      return reading(
        llama3InvFreq(
          d,
          base,
          need("factor"),
          need("low_freq_factor"),
          need("high_freq_factor"),
          L,
          RULES.llama3EqualFactors,
        ),
        1,
        L,
      );
    }
    case "longrope": {
      const L = need("original_max_position_embeddings");
      // phi3_long_rope_scaled_rope.py (17d618b): long factors for every position once max_model_len > original.
      const long = maxModelLen > L;
      const factors = (long ? rp.long_factor : rp.short_factor) as number[];
      const explicit = long ? rp.long_mscale : rp.short_mscale;
      const given = typeof explicit === "number" ? explicit : undefined;
      const r = longropeReading(d, base, factors, maxPosition / L, L, given, RULES.longropeLength);
      return reading(r.invFreq, r.attentionFactor, L);
    }
    default:
      throw new Error(`rope_type ${type} is outside what this reader follows`);
  }
}

export const vllmTarget: ExportTarget = {
  id: "vllm",
  label: "vLLM (--hf-overrides)",
  consumer: "vLLM",
  versions: [
    "main @ 0cd5784 (rotary_embedding/__init__.py)",
    "config/model.py @ 0052a5b",
    "rotary_embedding/mrope.py @ 055e47c",
  ],
  artifactKind: "launch-args",
  compile,
  read,
};
