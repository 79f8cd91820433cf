import { MAX_DB_ID } from "../../../shared/schemas/common";
import { num, type Json } from "./config-values";

/** Scaling types whose served length loaders derive as max_position_embeddings × factor when no original is named. */
const DERIVED_BY_FACTOR = ["linear", "dynamic", "yarn"];

/**
 * The two lengths of a model whose config already ships scaling (docs/model-layouts.md "Lineage").
 *
 * - With original_max_position_embeddings named (top level or block; the caller resolves which wins): the base was
 *   pre-trained at that length and the model is served at max_position_embeddings. huggingface/transformers,
 *   src/transformers/modeling_rope_utils.py, `_compute_yarn_parameters` (v4.5x line, read through stored copies):
 *   "DeepSeek-V3 … modify `max_position_embeddings` and have a `original_max_position_embeddings` field containing
 *   the pretrained value"; llama3 and longrope read the same pair.
 * - Without it, the loaders take max_position_embeddings itself as the pre-trained length (the same function's
 *   else branch; `_compute_dynamic_ntk_parameters` uses it as L; linear reads no length at all), and the served
 *   length is max_position_embeddings × factor: vllm-project/vllm, vllm/config.py, `_get_and_verify_max_len`
 *   (v0.6 line): for every rope_type but su, longrope and llama3, `derived_max_model_len *= scaling_factor`.
 */
export function lineageLengths(
  maxPos: number,
  original: number | undefined,
  scaling: Json | undefined,
  type: string | undefined,
): { pretrainedContext: number; servedContext: number } {
  if (!scaling || type === undefined || type === "default") return { pretrainedContext: maxPos, servedContext: maxPos };
  if (original !== undefined) return { pretrainedContext: original, servedContext: maxPos };
  const factor = num(scaling.factor);
  if (factor !== undefined && factor > 1 && DERIVED_BY_FACTOR.includes(type))
    return { pretrainedContext: maxPos, servedContext: Math.min(MAX_DB_ID, Math.round(maxPos * factor)) };
  return { pretrainedContext: maxPos, servedContext: maxPos };
}
