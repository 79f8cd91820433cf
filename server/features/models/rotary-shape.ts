import { num, type Json, type Warn } from "./config-values";
import { checkKvHeads, readHeadDim } from "./head-shape";

/*
 * The rotary base, the rotating dimension and the latent-attention widths of a config, with the warnings about
 * each. `block` is the scaling block of the scaled layers (flat rope_parameters, or its full_attention entry when
 * nested by layer type), where the newest configs keep rope_theta and partial_rotary_factor.
 */

export type RotaryShape = {
  headDim: number | undefined;
  kvHeads: number;
  partialRotaryFactor: number;
  rotaryDim: number | undefined;
  ropeTheta: number;
  kvLatentDim: number | null;
  latent: boolean;
};

/**
 * The base the newest loaders use. huggingface/transformers, RotaryEmbeddingConfigMixin.convert_rope_params_to_dict
 * (configuration_utils.py, v5 line, read through a stored copy): "Priority … 1. Values in `rope_parameters` dict",
 * then the top-level rope_theta, so a block value wins. The older rotary_emb_base is what GPT-NeoX-style configs
 * call it: models/gpt_neox/configuration_gpt_neox.py sets `self.rope_theta = rotary_emb_base` (v4.4x line).
 */
function readBase(cfg: Json, block: Json | undefined, warn: Warn): number {
  const inBlock = num(block?.rope_theta);
  const top = num(cfg.rope_theta);
  const legacy = num(cfg.rotary_emb_base);
  if (inBlock !== undefined && top !== undefined && inBlock !== top) {
    warn(
      "base_conflict",
      `rope_theta is ${top} at the top level but ${inBlock} inside rope_parameters; the newest loaders read rope_parameters, so the base is ${inBlock}.`,
      `Ropewalk uses ${inBlock}. Delete the top-level rope_theta (or make it ${inBlock}): older tools read it and compute θ′ from the wrong base.`,
    );
  } else if (inBlock === undefined && top !== undefined && legacy !== undefined && legacy !== top) {
    warn(
      "base_conflict",
      `rope_theta is ${top} but the older key rotary_emb_base is ${legacy}; loaders that know rope_theta read ${top}, GPT-NeoX-style loaders read ${legacy}.`,
      `Ropewalk uses rope_theta (${top}). Keep one key so every tool reads the same base.`,
    );
  }
  const base = inBlock ?? top ?? legacy;
  if (base !== undefined && inBlock === undefined && top === undefined) {
    warn(
      "rotary_emb_base_alias",
      `The base is given as rotary_emb_base (${legacy}), an older spelling of rope_theta.`,
      "Ropewalk reads it as rope_theta; write rope_theta if you edit the config.",
    );
  }
  if (base !== undefined) return base;
  warn(
    "rope_theta_missing",
    "The config has no rope_theta; loaders then use the RoFormer default of 10 000.",
    "Check the model card: if the model was trained with another base, enter it before analysing.",
  );
  return 10_000;
}

/** The fraction of each head that rotates: top-level partial_rotary_factor (v5 standardisation copies it into the block), the block's, or rotary_pct. */
function readFraction(cfg: Json, block: Json | undefined, warn: Warn): number {
  const prf = num(cfg.partial_rotary_factor) ?? num(block?.partial_rotary_factor);
  if (prf !== undefined) return prf;
  const pct = num(cfg.rotary_pct);
  if (pct === undefined) return 1;
  warn(
    "rotary_pct_alias",
    `The rotary fraction is given as rotary_pct (${pct}), an older spelling of partial_rotary_factor.`,
    "Ropewalk reads it as partial_rotary_factor; keep both keys consistent if you edit the config.",
  );
  return pct;
}

export function readRotaryShape(cfg: Json, block: Json | undefined, warn: Warn): RotaryShape {
  const hidden = num(cfg.hidden_size)!;
  const heads = num(cfg.num_attention_heads)!;
  const kvHeads = num(cfg.num_key_value_heads) ?? heads;
  const ropeTheta = readBase(cfg, block, warn);
  /*
   * Latent attention: only qk_rope_head_dim rotates, and the loaders build the rotary embedding over it:
   * models/deepseek_v3/configuration_deepseek_v3.py sets `self.head_dim = qk_rope_head_dim`; the cache holds
   * kv_lora_rank + qk_rope_head_dim per token and layer (modeling_deepseek_v3.py at f5a9ec5, `kv_a_proj_with_mqa`).
   */
  const qkRope = num(cfg.qk_rope_head_dim);
  if (qkRope !== undefined && Number.isInteger(qkRope) && qkRope > 0) {
    const kvLora = num(cfg.kv_lora_rank);
    checkKvHeads(heads, kvHeads, warn);
    return {
      headDim: qkRope,
      kvHeads,
      partialRotaryFactor: 1,
      rotaryDim: qkRope,
      ropeTheta,
      kvLatentDim: kvLora !== undefined && Number.isInteger(kvLora) && kvLora > 0 ? kvLora + qkRope : null,
      latent: kvLora !== undefined,
    };
  }
  // An odd head shape is a warning, never a refusal: the preview always renders, and saving waits for head_dim.
  const headDim = readHeadDim(hidden, heads, num(cfg.head_dim), warn);
  checkKvHeads(heads, kvHeads, warn);
  const prf = readFraction(cfg, block, warn);
  if (prf < 1 && headDim !== undefined) {
    warn(
      "partial_rotation",
      `Only ${prf * 100}% of each head rotates (partial_rotary_factor ${prf}): the rotary dimension is ${headDim * prf}, not ${headDim}.`,
      `Every pair count, band and bound here uses d = ${headDim * prf}; make sure your own scripts do too.`,
    );
  }
  const rotaryDim = headDim === undefined ? undefined : Math.round(headDim * prf);
  return { headDim, kvHeads, partialRotaryFactor: prf, rotaryDim, ropeTheta, kvLatentDim: null, latent: false };
}
