import type { CompileInput, CompileResult, ConsumerReading, ExportTarget, TargetArtifact } from "./types";
import { explicitYarnAttention, factorOf, headSize, paramsOf, resolvePlan } from "./engines/plan-facts";
import { isObj, numberOr } from "../../../shared/json-values";
import { blockSections, sectionKeysOf } from "../../../shared/mrope-axes";
import { argsOf, compactJson, flagValue, launchArtifact, parseJsonArgument } from "./engines/launch-text";
import { derivedContextLength } from "./engines/sglang-config";
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

const RULES = CONSUMER_RULES.sglang;

/**
 * SGLang, read at sgl-project/sglang main (files at the commits named beside each rule;
 * docs/export-targets-engines.md). Artifact: `--json-model-override-args <json> --context-length <target>`.
 * Models take `rope_theta` from the top level and pass `config.rope_scaling` to get_rope, so the override sets both.
 */
function overridesFor(input: CompileInput): Record<string, unknown> {
  const p = resolvePlan(input);
  const { trained: L, target } = p;
  const plain = (base: number) => ({ rope_scaling: null, rope_theta: base, max_position_embeddings: target });
  switch (p.params.method) {
    case "default":
    case "ntk":
    case "base":
      return plain(p.effectiveBase ?? p.base);
    case "linear":
      return {
        rope_scaling: { rope_type: "linear", factor: factorOf(p) },
        rope_theta: p.base,
        max_position_embeddings: target,
      };
    case "dynamic":
      // No original_max_position_embeddings in the block: get_context_length then derives factor × max_position_embeddings.
      return {
        rope_scaling: { rope_type: "dynamic", factor: factorOf(p) },
        rope_theta: p.base,
        max_position_embeddings: L,
      };
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
      };
      // SGLang ignores attention_factor, mscale and mscale_all_dim for "yarn"; its magnitude is g(s) × attn_factor.
      if (explicit !== null) block.attn_factor = explicit / yarnMscale(factorOf(p));
      return { rope_scaling: block, rope_theta: p.base, max_position_embeddings: target };
    }
    case "llama3": {
      const l3 = paramsOf(p, "llama3");
      const block = {
        rope_type: "llama3",
        factor: factorOf(p),
        low_freq_factor: l3.lowFreqFactor,
        high_freq_factor: l3.highFreqFactor,
        original_max_position_embeddings: L,
      };
      return { rope_scaling: block, rope_theta: p.base, max_position_embeddings: target };
    }
    case "longrope": {
      const lr = paramsOf(p, "longrope");
      // SGLang switches to the long factors per batch once a position passes the original length, so keys cached
      // earlier were turned with the short ones. Past the trained length the plan uses the long factors throughout:
      // writing them as both lists makes every batch agree.
      const used = target > L ? lr.longFactor : lr.shortFactor;
      const block = {
        rope_type: "longrope",
        long_factor: used,
        short_factor: used,
        original_max_position_embeddings: L,
      };
      return { rope_scaling: block, rope_theta: p.base, max_position_embeddings: target };
    }
  }
}

/**
 * Rope types get_rope builds a multimodal rotary for when the block carries `mrope_section`: "default" (MRotaryEmbedding)
 * and "yarn" (YaRNScalingMRotaryEmbedding); every other type runs one position axis (rotary_embedding/factory.py at
 * eb047c1, get_rope).
 *
 * YaRNScalingMRotaryEmbedding (python/sglang/srt/layers/rotary_embedding/mrope.py at 020d83a) is plain YaRN on the
 * multimodal layout: get_rope passes it `original_max_position_embeddings` as its length (no enlargement: the class
 * hands it to the base unchanged), with the same extrapolation_factor, attn_factor, beta_fast, beta_slow and truncate
 * as the one-axis class; its `_compute_inv_freq` builds the ramp from that length and scales the kept share by
 * extrapolation_factor, and its cos/sin are multiplied by yarn_get_mscale_simple(s) × attn_factor. It honours
 * `mrope_interleaved` (apply_interleaved_rope). So the reader reads a sectioned yarn block exactly as a plain one
 * (tests/unit/engine/targets/multimodal-yarn.test.ts pins it to hand-worked values).
 */
const SECTIONED_TYPES = ["default", "yarn"];

/**
 * MRotaryEmbedding (mrope.py at 020d83a) does not refuse sections whose sum is not rotary_dim / 2: it prints a notice
 * and rescales them (each × (d/2)/sum, floored, at least 1, the last taking the remainder). θ′ is unchanged, but the
 * pairs' axes are then not the config's.
 */
function sectionSumWarning(block: Record<string, unknown> | null, d: number): string | null {
  const s = blockSections(block)?.section;
  if (!s) return null;
  const sum = s.reduce((a, b) => a + b, 0);
  return sum === d / 2
    ? null
    : `SGLang rescales mrope_section ${JSON.stringify(s)} (sum ${sum}) to sum to ${d / 2} at load, so its pairs' axes are not the config's`;
}

function compile(input: CompileInput): CompileResult {
  const overrides = overridesFor(input);
  // The override replaces rope_scaling whole, so a model's multimodal sections are written into it; a plain-RoPE or
  // new-base plan keeps a "default" block holding them instead of removing it.
  const sections = sectionKeysOf(input.config.rope_scaling) ?? sectionKeysOf(input.config.rope_parameters);
  const block = isObj(overrides.rope_scaling) ? overrides.rope_scaling : { rope_type: "default" };
  if (sections) overrides.rope_scaling = { ...block, ...sections };
  const args = [
    "--json-model-override-args",
    compactJson(overrides),
    "--context-length",
    String(input.plan.targetContext),
  ];
  const artifact = launchArtifact('python -m sglang.launch_server --model-path "$MODEL"', args, {
    modelOverrides: overrides,
  });
  const refused = sections && unsectionedTypeRefusal("SGLang", SECTIONED_TYPES, String(block.rope_type), artifact);
  if (refused) return refused;
  return { ok: true, artifact };
}

function read(config: Record<string, unknown>, artifact: TargetArtifact, runningLength?: number): ConsumerReading {
  const args = argsOf(artifact);
  const warnings: string[] = [];
  const text = flagValue(args, "--json-model-override-args");
  const { value: overrides, intFloats } = text ? parseJsonArgument(text) : { value: {}, intFloats: [] };
  for (const p of intFloats) warnings.push(`${p} is written as an integer where the config types a float`);
  // ModelConfig (configs/model_config.py, 001adf5) → get_config (utils/hf_transformers_utils.py, 2aa2e2d):
  // `config.update(model_override_args)`, top-level keys replaced whole.
  const merged = { ...config, ...overrides };
  const derived = derivedContextLength(merged);
  const contextText = flagValue(args, "--context-length");
  const contextLength = contextText !== undefined ? Number(contextText) : derived;
  if (contextLength > derived) {
    warnings.push(
      `context_length ${contextLength} is greater than the derived context_length ${derived}: SGLang refuses to start unless SGLANG_ALLOW_OVERWRITE_LONGER_CONTEXT_LEN=1`,
    );
  }

  const base = numberOr(merged.rope_theta, 10000);
  // get_rope (rotary_embedding/factory.py, eb047c1): rotary dim × partial_rotary_factor when it is below 1.
  const partial = numberOr(merged.partial_rotary_factor, 1);
  const head = headSize(merged);
  const d = partial < 1 ? Math.floor(head * partial) : head;
  const maxPosition = numberOr(merged.max_position_embeddings, 2048);
  const rs = isObj(merged.rope_scaling) ? merged.rope_scaling : null;
  const type = rs
    ? typeof rs.rope_type === "string"
      ? rs.rope_type
      : typeof rs.type === "string"
        ? rs.type
        : null
    : "default";
  if (type === null) throw new Error("rope_scaling has neither rope_type nor type: SGLang refuses it");
  const sumWarning = SECTIONED_TYPES.includes(type) ? sectionSumWarning(rs, d) : null;
  if (sumWarning) warnings.push(sumWarning);
  const need = (key: string) => {
    if (!rs || !(key in rs)) throw new Error(`SGLang's get_rope needs ${key} for rope_type ${type}`);
    return rs[key] as number;
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
    case "default":
      return reading(plainInvFreq(d, base), 1, null);
    case "linear":
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
      const ext = numberOr(rs?.extrapolation_factor, 1);
      const inv = yarnInvFreq({
        d,
        base,
        factor: f,
        original: L,
        betaFast: numberOr(rs?.beta_fast, 32),
        betaSlow: numberOr(rs?.beta_slow, 1),
        truncate: rs?.truncate !== false,
        extrapolationFactor: ext,
      });
      // attention_factor, mscale and mscale_all_dim are not read for "yarn" (factory.py): silently ignored. The same
      // holds for a block with sections (YaRNScalingMRotaryEmbedding, SECTIONED_TYPES above).
      return reading(inv, yarnMscale(f) * numberOr(rs?.attn_factor, 1), L);
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
      // rope_variant.py forward (0b1fd02): the long cache once any position in the batch passes the original length.
      const long = (runningLength ?? contextLength) > L;
      const factors = (long ? rs?.long_factor : rs?.short_factor) as number[];
      const explicit = long ? rs?.long_mscale : rs?.short_mscale;
      const given = typeof explicit === "number" ? explicit : undefined;
      const r = longropeReading(d, base, factors, maxPosition / L, L, given, RULES.longropeLength);
      return reading(r.invFreq, r.attentionFactor, L);
    }
    default:
      throw new Error(`rope_type ${type} is outside what this reader follows`);
  }
}

export const sglangTarget: ExportTarget = {
  id: "sglang",
  label: "SGLang (--json-model-override-args)",
  consumer: "SGLang",
  versions: [
    "main @ eb047c1 (rotary_embedding/factory.py)",
    "configs/model_config.py @ 001adf5",
    "rotary_embedding/mrope.py @ 020d83a",
  ],
  artifactKind: "launch-args",
  compile,
  read,
};
