import type { ConsumerReading, TargetArtifact } from "../types";
import { argsOf, flagValue } from "./launch-text";
import { convertedFreqFactors, convertedMetadata, key, parseKvOverride, type Metadata } from "./gguf";
import { isObj } from "../../../../shared/json-values";

/**
 * What llama.cpp runs for a GGUF converted from `config` with the artifact applied: metadata first (the file as
 * rewritten), then `--override-kv`, then the flags. Numbers the runtime keeps as C floats are rounded to float32
 * (Math.fround) where it stores them; the rotation itself is computed in float64 from those values.
 */
const f32 = Math.fround;

function applyArtifactMetadata(config: Record<string, unknown>, artifact: TargetArtifact, args: string[]): Metadata {
  const meta: Metadata = { ...convertedMetadata(config) };
  const written = artifact.content.metadata;
  if (isObj(written)) {
    for (const [k, v] of Object.entries(written)) {
      if (typeof v === "number" || typeof v === "string" || typeof v === "boolean") meta[k] = v;
      else if (Array.isArray(v) && v.every((n) => typeof n === "number")) meta[k] = v as number[];
    }
  }
  args.forEach((a, i) => {
    if (a === "--override-kv" && i + 1 < args.length) {
      const [k, v] = parseKvOverride(args[i + 1]);
      meta[k] = v;
    }
  });
  return meta;
}

const metaNumber = (meta: Metadata, k: string): number | undefined =>
  typeof meta[k] === "number" ? (meta[k] as number) : undefined;
const flagNumber = (args: string[], flag: string): number | undefined => {
  const v = flagValue(args, flag);
  if (v === undefined) return undefined;
  const n = Number(v);
  if (!Number.isFinite(n)) throw new Error(`${flag} ${v}: llama.cpp cannot parse it as a number`);
  return n;
};

export function readLlamaCpp(config: Record<string, unknown>, artifact: TargetArtifact): ConsumerReading {
  const args = argsOf(artifact);
  const meta = applyArtifactMetadata(config, artifact, args);
  const arch = String(meta["general.architecture"]);
  const warnings: string[] = [];

  // llama-model.cpp load_hparams: context_length → n_ctx_train; original_context_length defaults to it;
  // freq_base defaults to 10000; scaling type defaults to "linear"; factor (or scale_linear) → freq_scale = 1/factor.
  const nCtxTrain = metaNumber(meta, key(arch, "context_length")) ?? 0;
  const nCtxOrigMeta = metaNumber(meta, key(arch, "rope.scaling.original_context_length")) ?? nCtxTrain;
  const baseTrain = f32(metaNumber(meta, key(arch, "rope.freq_base")) ?? 10000);
  const typeTrain = String(meta[key(arch, "rope.scaling.type")] ?? "linear");
  const ropeScale =
    metaNumber(meta, key(arch, "rope.scaling.factor")) ?? metaNumber(meta, key(arch, "rope.scale_linear")) ?? 0;
  const freqScaleTrain = ropeScale === 0 ? 1 : f32(1 / f32(ropeScale));
  const d = metaNumber(meta, key(arch, "rope.dimension_count")) ?? 0;

  // common/arg.cpp: --rope-scale N sets rope_freq_scale = 1.0f / N; --rope-freq-scale sets it directly.
  const scaleFlag = flagNumber(args, "--rope-scale");
  const freqScaleFlag = flagNumber(args, "--rope-freq-scale");
  const freqScaleParam =
    freqScaleFlag !== undefined ? f32(freqScaleFlag) : scaleFlag !== undefined ? f32(1 / f32(scaleFlag)) : 0;
  // llama-context.cpp: 0 means "from the model" for n_ctx, base and scale; yarn_orig_ctx 0 → metadata → n_ctx_train.
  const nCtx = flagNumber(args, "-c") ?? flagNumber(args, "--ctx-size") ?? nCtxTrain;
  const base = f32(flagNumber(args, "--rope-freq-base") || baseTrain);
  let freqScale = freqScaleParam || freqScaleTrain;
  const nCtxOrig = flagNumber(args, "--yarn-orig-ctx") || nCtxOrigMeta;
  const type = flagValue(args, "--rope-scaling") ?? typeTrain;
  if (!["none", "linear", "yarn"].includes(type))
    throw new Error(`--rope-scaling ${type}: llama.cpp knows none, linear, yarn`);
  if (type === "none") freqScale = 1;
  // llama-context.cpp (4c7103b): a negative flag means "from the model": hparams.yarn_* (the rope.scaling.yarn_* keys
  // of llama-arch.cpp; defaults ext −1, attention 1, β 32 and 1 — the key loading is from memory); ext still negative
  // → 1 for yarn, else 0; the attention factor is then multiplied by rope.scaling.attn_factor (llama-model.cpp).
  const fromModel = (flag: string, metaKey: string, fallback: number) => {
    const v = flagNumber(args, flag);
    return v !== undefined && v >= 0 ? v : (metaNumber(meta, key(arch, metaKey)) ?? fallback);
  };
  const extSet = fromModel("--yarn-ext-factor", "rope.scaling.yarn_ext_factor", -1);
  const ext = f32(extSet < 0 ? (type === "yarn" ? 1 : 0) : extSet);
  const ropeAttn = f32(metaNumber(meta, key(arch, "rope.scaling.attn_factor")) ?? 1);
  const attn = f32(f32(fromModel("--yarn-attn-factor", "rope.scaling.yarn_attn_factor", 1)) * ropeAttn);
  const betaFast = f32(fromModel("--yarn-beta-fast", "rope.scaling.yarn_beta_fast", 32));
  const betaSlow = f32(fromModel("--yarn-beta-slow", "rope.scaling.yarn_beta_slow", 1));

  if (nCtx > nCtxTrain) {
    warnings.push(`n_ctx_seq (${nCtx}) > n_ctx_train (${nCtxTrain}) -- possible training context overflow`);
  }

  // ggml rope (ggml-cpu ops.cpp rope_yarn, ggml_rope_yarn_corr_dims): ramp ends always floored/ceiled and clamped;
  // ramp_mix = (1 − clamp((i − low)/max(0.001, high − low))) · ext; θ′ = θ·fs·(1 − mix) + θ·mix;
  // magnitude = attn · (1 + 0.1·ln(1/fs)) whenever ext ≠ 0. θ_i is divided by a rope_freqs tensor when the file has one.
  const corr = (rot: number) => (d * Math.log(nCtxOrig / (rot * 2 * Math.PI))) / (2 * Math.log(base));
  const low = Math.max(0, Math.floor(corr(betaFast)));
  const high = Math.min(d - 1, Math.ceil(corr(betaSlow)));
  const factors = convertedFreqFactors(config, d, base);
  const invFreq = Array.from({ length: d / 2 }, (_, i) => {
    const theta = Math.pow(base, (-2 * i) / d) / (factors ? factors[i] : 1);
    if (ext === 0) return theta * freqScale;
    const y = (i - low) / Math.max(0.001, high - low);
    const mix = (1 - Math.min(1, Math.max(0, y))) * ext;
    return theta * freqScale * (1 - mix) + theta * mix;
  });
  const attentionFactor = ext !== 0 ? attn * (1 + 0.1 * Math.log(1 / freqScale)) : attn;
  return {
    rotaryDim: d,
    base,
    originalLength: type === "yarn" ? nCtxOrig : null,
    method: factors ? `${type} + rope_freqs` : type,
    invFreq,
    attentionFactor,
    warnings,
  };
}
