/**
 * Reads a model's config.json (the open model-configuration keys) into a profile draft plus plain-words warnings.
 * Pure: no I/O. The warnings follow the "what practitioners get wrong" list of the domain notes.
 */
import type { CurrentScaling, ImportPreviewProfile, ImportWarning } from "../../../shared/schemas";
import { FULL_ATTENTION } from "../../../shared/layer-groups";
import { isObj, num, type Json, type Warn } from "./config-values";
import { findHostile } from "../../platform/hostile";
import { nonRotaryScheme, notRotaryMessage } from "./position-scheme";
import { readRotaryShape } from "./rotary-shape";
import { readScalingBlock } from "./scaling-block";
import { nestedRopeParameters, readLayerGroups } from "./layer-layout";
import { lineageLengths } from "./lineage-lengths";

export class ConfigImportError extends Error {
  constructor(
    message: string,
    readonly fields: Record<string, string>,
    /** The API error code: "invalid", or "not_rotary" for a model whose positions are not rotary. */
    readonly code: "invalid" | "not_rotary" = "invalid",
  ) {
    super(message);
  }
}

const DTYPE_BYTES: Record<string, number> = { bfloat16: 2, float16: 2, float32: 4, float8_e4m3fn: 1, int8: 1 };

/** A table lookup by untrusted text: own keys only, so "constructor" or "__proto__" finds nothing. */
const lookup = <T>(table: Record<string, T>, key: string): T | undefined =>
  Object.hasOwn(table, key) ? table[key] : undefined;

/**
 * Non-embedding parameters estimated from the shape: attention q/o (hidden × heads·headDim each), k/v (hidden × kv·headDim each),
 * MLP 3·hidden·intermediate when gated (SiLU-gated families), else 2·hidden·intermediate; biases and norms ignored.
 * Without intermediate_size, Kaplan et al. 2020's N ≈ 12·layers·hidden² is used.
 */
export function estimateNonEmbeddingParameters(c: Json, headDim: number, heads: number, kv: number): number {
  const h = num(c.hidden_size)!;
  const layers = num(c.num_hidden_layers)!;
  const inter = num(c.intermediate_size);
  if (!inter) return 12 * layers * h * h;
  const attn = 2 * h * heads * headDim + 2 * h * kv * headDim;
  const gated = !/^(gelu|gelu_new|relu)$/.test(String(c.hidden_act ?? "silu"));
  return layers * (attn + (gated ? 3 : 2) * h * inter);
}

function readJson(text: string): Json {
  let c: unknown;
  try {
    // A UTF-8 byte-order mark is legal at the start of a file (RFC 8259 §8.1 lets parsers ignore it); JSON.parse is not.
    c = JSON.parse(text.replace(/^\uFEFF/, ""));
  } catch (e) {
    throw new ConfigImportError("the file is not JSON", { file: `not valid JSON: ${(e as Error).message}` });
  }
  const hostile = findHostile(c);
  if (hostile)
    throw new ConfigImportError(`the file is not a usable config: ${hostile.message}`, {
      file: `${hostile.path.join(".") || "(file)"}: ${hostile.message}`,
    });
  if (!isObj(c))
    throw new ConfigImportError("the file is JSON but not an object", {
      file: "expected a JSON object of configuration keys",
    });
  // Multimodal configs nest the language model's keys.
  if (num(c.hidden_size) === undefined && isObj(c.text_config))
    return { ...c.text_config, _name_or_path: c._name_or_path };
  return c;
}

/**
 * The scaling block of the scaled layers. rope_scaling wins over rope_parameters (RotaryEmbeddingConfigMixin,
 * v5 line: `rope_parameters = rope_scaling or rope_parameters`); nested rope_parameters give the full-attention
 * entry. A flat block without a rope_type only carries the base.
 */
function scaledBlock(cfg: Json): { block: Json | undefined; scaling: Json | undefined } {
  const nested = nestedRopeParameters(cfg);
  const rp = nested ? nested[FULL_ATTENTION] : isObj(cfg.rope_parameters) ? cfg.rope_parameters : undefined;
  if (isObj(cfg.rope_scaling)) return { block: rp, scaling: cfg.rope_scaling };
  return { block: rp, scaling: rp && (rp.rope_type ?? rp.type) ? rp : undefined };
}

/**
 * Multimodal sections: pairs per position axis (time, height, width), which must add up to the rotating pairs:
 * huggingface/transformers, models/qwen2_vl/modeling_qwen2_vl.py, apply_multimodal_rotary_pos_emb splits cos/sin
 * by `mrope_section * 2` over the head's rotary dimension (v4.4x line, read through stored copies).
 */
function readSections(src: Json | undefined, rotaryDim: number | undefined, warn: Warn) {
  const sec = src?.mrope_section;
  if (!Array.isArray(sec) || !sec.length || !sec.every((x) => Number.isInteger(x) && (x as number) > 0))
    return { mropeSection: null, mropeInterleaved: false };
  const sections = sec as number[];
  const sum = sections.reduce((a, b) => a + b, 0);
  if (rotaryDim !== undefined && sum * 2 !== rotaryDim) {
    warn(
      "mrope_section_sum",
      `mrope_section [${sections.join(", ")}] adds up to ${sum} pairs, but the rotary dimension ${rotaryDim} has ${rotaryDim / 2}.`,
      `The sections must add up to rotaryDim / 2 = ${rotaryDim / 2}; check them against the model card before planning, or the axes rotate the wrong pairs.`,
    );
  }
  return { mropeSection: sections, mropeInterleaved: src?.mrope_interleaved === true };
}

export function parseModelConfig(
  text: string,
  fileName = "config.json",
): { profile: ImportPreviewProfile; warnings: ImportWarning[] } {
  const cfg = readJson(text);
  const warnings: ImportWarning[] = [];
  const warn: Warn = (code, message, fix) => warnings.push({ code, message, fix });

  const notRotary = nonRotaryScheme(cfg);
  if (notRotary)
    throw new ConfigImportError(notRotaryMessage(notRotary), { [notRotary.key]: notRotary.why }, "not_rotary");
  const missing: Record<string, string> = {};
  for (const key of ["hidden_size", "num_attention_heads", "num_hidden_layers", "max_position_embeddings"]) {
    const v = num(cfg[key]);
    if (v === undefined) missing[key] = "missing or not a number";
    else if (!Number.isInteger(v) || v <= 0) missing[key] = "must be a positive whole number";
  }
  if (Object.keys(missing).length) {
    throw new ConfigImportError(`the config lacks keys the engine needs: ${Object.keys(missing).join(", ")}`, missing);
  }
  const hidden = num(cfg.hidden_size)!;
  const heads = num(cfg.num_attention_heads)!;
  const layers = num(cfg.num_hidden_layers)!;
  const { block, scaling } = scaledBlock(cfg);
  const shape = readRotaryShape(cfg, block, warn);

  const maxPos = num(cfg.max_position_embeddings)!;
  let currentScaling: CurrentScaling | null = null;
  let original: number | undefined;
  if (scaling) {
    const read = readScalingBlock(cfg, scaling, maxPos, shape.latent, warn);
    currentScaling = read.currentScaling;
    original = read.original;
  }
  const lengths = lineageLengths(maxPos, original, scaling, currentScaling?.method);
  const trainedContext = lengths.pretrainedContext;
  const sections = readSections(scaling ?? block, shape.rotaryDim, warn);
  const layerGroups = readLayerGroups(
    cfg,
    {
      layers,
      headDim: shape.headDim ?? 0,
      partialRotaryFactor: shape.partialRotaryFactor,
      ropeTheta: shape.ropeTheta,
      currentScaling,
    },
    warn,
  );
  const dtype = String(cfg.torch_dtype ?? cfg.dtype ?? "");
  const name =
    String(cfg._name_or_path ?? "")
      .split("/")
      .pop() || fileName.replace(/\.json$/i, "");
  // Without a trusted head_dim the estimate uses hidden_size / heads; it is replaced once the author gives head_dim.
  // Latent attention's projections are not shaped by the rotary head dimension, so the estimate uses hidden / heads.
  const estimateHead = shape.latent ? hidden / heads : (shape.headDim ?? hidden / heads);
  const parameters = estimateNonEmbeddingParameters(cfg, estimateHead, heads, shape.kvHeads);
  warn(
    "parameters_estimated",
    `The config carries no parameter count; ${(parameters / 1e9).toFixed(2)} B non-embedding parameters were estimated from its shape.`,
    "Replace it with the published count if you have one: it drives every FLOP figure of the budget.",
  );

  return {
    profile: {
      name,
      family: String(cfg.model_type ?? "unknown"),
      headDim: shape.headDim,
      partialRotaryFactor: shape.partialRotaryFactor,
      rotaryDim: shape.rotaryDim,
      ropeTheta: shape.ropeTheta,
      trainedContext,
      pretrainedContext: trainedContext,
      servedContext: lengths.servedContext,
      maxPositionEmbeddings: maxPos,
      layers,
      attentionHeads: heads,
      kvHeads: shape.kvHeads,
      hiddenSize: hidden,
      parameters,
      parametersTotal: null,
      bytesPerElement: lookup(DTYPE_BYTES, dtype) ?? 2,
      provenance: `imported from ${fileName}`,
      currentScaling,
      layerGroups,
      ...sections,
      kvLatentDim: shape.kvLatentDim,
    },
    warnings,
  };
}
