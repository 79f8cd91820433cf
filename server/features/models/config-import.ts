/**
 * Reads a model's config.json (the open model-configuration keys) into a profile draft plus plain-words warnings.
 * Pure: no I/O. The warnings follow the "what practitioners get wrong" list of the domain notes.
 */
import type { CurrentScaling, ImportPreviewProfile, ImportWarning } from "../../../shared/schemas";
import { COMMON_SCALING_KEYS, methodForRopeType } from "../../../shared/methods";
import { ropeScalingKnownKeys, suggestKey } from "./rope-scaling-keys";
import { scalingWarnings } from "./scaling-warnings";
import { isObj, num, type Json, type Warn } from "./config-values";
import { checkKvHeads, readHeadDim } from "./head-shape";
import { findHostile } from "../../platform/hostile";

export class ConfigImportError extends Error {
  constructor(
    message: string,
    readonly fields: Record<string, string>,
  ) {
    super(message);
  }
}

const DTYPE_BYTES: Record<string, number> = { bfloat16: 2, float16: 2, float32: 4, float8_e4m3fn: 1, int8: 1 };

/** rope_scaling keys that place the method rather than parametrise it: left out of the imported parameters. */
const NOT_PARAMETERS: readonly string[] = COMMON_SCALING_KEYS.filter((k) => k !== "factor");

/** A table lookup by untrusted text: own keys only, so "constructor" or "__proto__" finds nothing. */
const lookup = <T>(table: Record<string, T>, key: string): T | undefined =>
  Object.hasOwn(table, key) ? table[key] : undefined;

const camel = (k: string) => k.replace(/_([a-z])/g, (_m, c: string) => c.toUpperCase());

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

export function parseModelConfig(
  text: string,
  fileName = "config.json",
): { profile: ImportPreviewProfile; warnings: ImportWarning[] } {
  const cfg = readJson(text);
  const warnings: ImportWarning[] = [];
  const warn: Warn = (code, message, fix) => warnings.push({ code, message, fix });

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
  const kvHeads = num(cfg.num_key_value_heads) ?? heads;
  // An odd head shape is a warning, never a refusal: the preview always renders, and saving waits for head_dim.
  const headDim = readHeadDim(hidden, heads, num(cfg.head_dim), warn);
  checkKvHeads(heads, kvHeads, warn);
  const ropeParams = isObj(cfg.rope_parameters) ? cfg.rope_parameters : undefined;
  let ropeTheta = num(cfg.rope_theta) ?? num(ropeParams?.rope_theta);
  if (ropeTheta === undefined) {
    ropeTheta = 10_000;
    warn(
      "rope_theta_missing",
      "The config has no rope_theta; loaders then use the RoFormer default of 10 000.",
      "Check the model card: if the model was trained with another base, enter it before analysing.",
    );
  }
  let prf = num(cfg.partial_rotary_factor) ?? num(ropeParams?.partial_rotary_factor);
  if (prf === undefined && num(cfg.rotary_pct) !== undefined) {
    prf = num(cfg.rotary_pct);
    warn(
      "rotary_pct_alias",
      `The rotary fraction is given as rotary_pct (${prf}), an older spelling of partial_rotary_factor.`,
      "Ropewalk reads it as partial_rotary_factor; keep both keys consistent if you edit the config.",
    );
  }
  prf ??= 1;
  if (prf < 1 && headDim !== undefined) {
    warn(
      "partial_rotation",
      `Only ${prf * 100}% of each head rotates (partial_rotary_factor ${prf}): the rotary dimension is ${headDim * prf}, not ${headDim}.`,
      `Every pair count, band and bound here uses d = ${headDim * prf}; make sure your own scripts do too.`,
    );
  }

  const maxPos = num(cfg.max_position_embeddings)!;
  let trainedContext = maxPos;
  let currentScaling: CurrentScaling | null = null;
  const rs = isObj(cfg.rope_scaling)
    ? cfg.rope_scaling
    : ropeParams && (ropeParams.rope_type ?? ropeParams.type)
      ? ropeParams
      : undefined;
  if (rs) {
    const type = String(rs.rope_type ?? rs.type ?? "default");
    const original = num(rs.original_max_position_embeddings) ?? num(cfg.original_max_position_embeddings);
    if (original !== undefined) trainedContext = original;
    const method = methodForRopeType(type)?.id;
    const known = ropeScalingKnownKeys(type);
    for (const key of Object.keys(rs)) {
      if (known && !known.includes(key)) {
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
    scalingWarnings(method, type, rs, maxPos, original, warn);
    const params: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(rs)) {
      if (!NOT_PARAMETERS.includes(k)) params[camel(k)] = v;
    }
    currentScaling = { method: method ?? type, params, raw: rs };
  }
  const dtype = String(cfg.torch_dtype ?? cfg.dtype ?? "");
  const name =
    String(cfg._name_or_path ?? "")
      .split("/")
      .pop() || fileName.replace(/\.json$/i, "");
  // Without a trusted head_dim the estimate uses hidden_size / heads; it is replaced once the author gives head_dim.
  const parameters = estimateNonEmbeddingParameters(cfg, headDim ?? hidden / heads, heads, kvHeads);
  warn(
    "parameters_estimated",
    `The config carries no parameter count; ${(parameters / 1e9).toFixed(2)} B non-embedding parameters were estimated from its shape.`,
    "Replace it with the published count if you have one: it drives every FLOP figure of the budget.",
  );

  return {
    profile: {
      name,
      family: String(cfg.model_type ?? "unknown"),
      headDim,
      partialRotaryFactor: prf,
      ropeTheta,
      trainedContext,
      maxPositionEmbeddings: maxPos,
      layers: num(cfg.num_hidden_layers)!,
      attentionHeads: heads,
      kvHeads,
      hiddenSize: hidden,
      parameters,
      parametersTotal: null,
      bytesPerElement: lookup(DTYPE_BYTES, dtype) ?? 2,
      provenance: `imported from ${fileName}`,
      currentScaling,
    },
    warnings,
  };
}
