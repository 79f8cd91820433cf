import { isObj, numberOr } from "../../../../shared/json-values";

/** The keys get_context_length tries, first found wins (python/sglang/srt/utils/hf_transformers_utils.py, 2aa2e2d). */
const CONTEXT_KEYS = [
  "max_sequence_length",
  "seq_length",
  "max_seq_len",
  "model_max_length",
  "max_position_embeddings",
];

/**
 * get_context_length: the first length key, times rope_scaling.factor unless the block names an
 * original_max_position_embeddings or is llama3; 2048 without any key.
 */
export function derivedContextLength(config: Record<string, unknown>): number {
  const rs = isObj(config.rope_scaling) ? config.rope_scaling : null;
  let factor = rs ? numberOr(rs.factor, 1) : 1;
  if (rs && ("original_max_position_embeddings" in rs || rs.rope_type === "llama3")) factor = 1;
  for (const key of CONTEXT_KEYS) {
    const v = config[key];
    if (typeof v === "number") return Math.floor(factor * v);
  }
  return 2048;
}
