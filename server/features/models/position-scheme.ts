import { isObj, num, type Json } from "./config-values";

/*
 * Recognises configs whose positions are not rotary, so the import refuses them by name (400 `not_rotary`) instead
 * of reading them as a rotary model with base 10 000 or failing on missing keys. The keys are the ones the loaders
 * branch on (huggingface/transformers, read through the stored copies; versions noted where known):
 * - `position_embedding_type` "absolute" / "relative_key" / "relative_key_query": models/bert/modeling_bert.py,
 *   BertEmbeddings and BertSelfAttention (v4.45 line);
 * - `alibi: true`: models/falcon/modeling_falcon.py, FalconAttention uses ALiBi instead of its rotary embedding;
 *   `attn_config.alibi`: MPT's config (from memory); BLOOM always uses ALiBi (models/bloom, from memory);
 * - `sinusoidal_pos_embds: true`: models/distilbert/configuration_distilbert.py (from memory); Marian and Pegasus
 *   build fixed sinusoidal tables (their *SinusoidalPositionalEmbedding classes, from memory);
 * - `n_positions` without any rotary key: models/gpt2 (learned wpe table); GPT-J and CodeGen carry `rotary_dim`
 *   beside `n_positions`, which is why a rotary key anywhere keeps the config;
 * - `no_rope_layers` all 0: models/smollm3/modeling_smollm3.py, `use_rope = config.no_rope_layers[layer_idx]`.
 */

export type NotRotary = { scheme: string; key: string; why: string };

/** Keys that only a rotary model carries. */
const ROTARY_KEYS = [
  "rope_theta",
  "rope_scaling",
  "rope_parameters",
  "rotary_emb_base",
  "rotary_pct",
  "rotary_dim",
  "partial_rotary_factor",
  "qk_rope_head_dim",
  "rope_local_base_freq",
] as const;

const LEARNED =
  "learned absolute positions (a trained table with one vector per position up to the trained length; positions past it have no vector at all)";
const SINUSOIDAL = "fixed sinusoidal position tables (added to the input once, not rotated into queries and keys)";
const ALIBI = "linear attention biases (ALiBi: a distance penalty added to attention scores, no rotation)";
const NONE = "no position encoding at all (order comes only from the causal mask)";
const RELATIVE = "learned relative-distance embeddings (a trained vector per clipped distance, no rotation)";

/** Model types whose position scheme is fixed by the architecture (from memory of their modelling files). */
const BY_MODEL_TYPE: Record<string, string> = {
  gpt2: LEARNED,
  opt: LEARNED,
  bert: LEARNED,
  roberta: LEARNED,
  gpt_bigcode: LEARNED,
  bloom: ALIBI,
  mpt: ALIBI,
  marian: SINUSOIDAL,
  pegasus: SINUSOIDAL,
};

export function hasRotaryKeys(c: Json): boolean {
  if (ROTARY_KEYS.some((k) => c[k] !== undefined && c[k] !== null)) return true;
  if (c.position_embedding_type === "rotary") return true;
  return Array.isArray(c.no_rope_layers) && c.no_rope_layers.some((v) => v === 1 || v === true);
}

/** The non-rotary scheme a config uses, or undefined when its positions are (or may be) rotary. */
export function nonRotaryScheme(c: Json): NotRotary | undefined {
  const pet = typeof c.position_embedding_type === "string" ? c.position_embedding_type.toLowerCase() : undefined;
  // An explicit ALiBi switch wins over rotary keys: the loaders then skip the rotary embedding.
  if (c.alibi === true) return { scheme: ALIBI, key: "alibi", why: "alibi is true" };
  if (isObj(c.attn_config) && c.attn_config.alibi === true)
    return { scheme: ALIBI, key: "attn_config.alibi", why: "attn_config.alibi is true" };
  if (pet === "alibi")
    return { scheme: ALIBI, key: "position_embedding_type", why: 'position_embedding_type is "alibi"' };
  if (hasRotaryKeys(c)) return undefined;
  if (pet === "absolute")
    return { scheme: LEARNED, key: "position_embedding_type", why: 'position_embedding_type is "absolute"' };
  if (pet === "relative_key" || pet === "relative_key_query")
    return { scheme: RELATIVE, key: "position_embedding_type", why: `position_embedding_type is "${pet}"` };
  if (pet === "sinusoidal")
    return { scheme: SINUSOIDAL, key: "position_embedding_type", why: 'position_embedding_type is "sinusoidal"' };
  if (pet === "none" || pet === "nope")
    return { scheme: NONE, key: "position_embedding_type", why: `position_embedding_type is "${pet}"` };
  if (c.sinusoidal_pos_embds === true)
    return { scheme: SINUSOIDAL, key: "sinusoidal_pos_embds", why: "sinusoidal_pos_embds is true" };
  if (Array.isArray(c.no_rope_layers) && c.no_rope_layers.length > 0)
    return { scheme: NONE, key: "no_rope_layers", why: "no_rope_layers marks every layer as having no rotary" };
  const type = typeof c.model_type === "string" ? c.model_type : "";
  if (Object.hasOwn(BY_MODEL_TYPE, type))
    return { scheme: BY_MODEL_TYPE[type], key: "model_type", why: `model_type is "${type}"` };
  if (num(c.n_positions) !== undefined)
    return {
      scheme: LEARNED,
      key: "n_positions",
      why: "it sizes a learned table with n_positions and has no rotary key",
    };
  return undefined;
}

export function notRotaryMessage(n: NotRotary): string {
  return (
    `This model does not use rotary positions: it uses ${n.scheme} (${n.why}). ` +
    "Ropewalk plans context extension by rescaling rotary frequencies; a model without them has no frequencies to rescale."
  );
}
