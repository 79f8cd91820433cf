import type { Warn } from "./config-values";

/*
 * How loaders read the head shape (huggingface/transformers, src/transformers/models/llama/modeling_llama.py,
 * LlamaAttention.__init__ at commit 002272831fba): head_dim falls back to hidden_size // num_attention_heads (integer
 * division) and is refused unless it multiplies back to hidden_size; num_key_value_groups = num_heads //
 * num_key_value_heads, and repeat_kv copies each key/value head that many times, so the key/value heads must divide
 * the query heads (grouped-query attention: Ainslie et al. 2023, "GQA", §2.2, section number from memory — query heads in G equal groups).
 * See docs/head-shape.md.
 */

const isPositiveInt = (v: number) => Number.isInteger(v) && v > 0;

/** The positive divisors of n, ascending; pairs k and n / k up to √n so a huge count in a file stays cheap. */
export function divisorsOf(n: number): number[] {
  const low: number[] = [];
  const high: number[] = [];
  for (let k = 1; k * k <= n; k++) {
    if (n % k !== 0) continue;
    low.push(k);
    if (k * k !== n) high.unshift(n / k);
  }
  return [...low, ...high];
}

const listWords = (xs: number[]) =>
  xs.length < 2 ? xs.join("") : `${xs.slice(0, -1).join(", ")} or ${xs[xs.length - 1]}`;
const show = (x: number) => (Number.isInteger(x) ? String(x) : x.toFixed(2));

/**
 * The head dimension a preview can trust, or undefined (the author must enter head_dim) with a warning saying why.
 * Never throws: the preview always renders.
 */
export function readHeadDim(hidden: number, heads: number, given: number | undefined, warn: Warn): number | undefined {
  const ratio = hidden / heads;
  if (given !== undefined) {
    if (isPositiveInt(given)) {
      if (given !== ratio) {
        warn(
          "head_dim_differs",
          `head_dim is ${given}, but hidden_size / num_attention_heads is ${show(ratio)}.`,
          `Use head_dim (${given}) for every rotary figure; tools that derive it from hidden_size compute the wrong frequencies.`,
        );
      }
      return given;
    }
    warn(
      "head_dim_not_integer",
      `head_dim is ${given}, which is not a whole number of dimensions per head.`,
      "Enter the head_dim the model was trained with (from the model card or its modelling code); the profile cannot be saved until it is given.",
    );
    return undefined;
  }
  if (isPositiveInt(ratio)) return ratio;
  warn(
    "head_dim_not_integer",
    `The config has no head_dim, and hidden_size / num_attention_heads = ${hidden} / ${heads} = ${show(ratio)} is not a whole number; loaders that derive it take ${Math.floor(ratio)} or refuse the config.`,
    "Enter head_dim from the model card or its modelling code; the profile cannot be saved until it is given.",
  );
  return undefined;
}

/** Grouped-query attention needs the key/value heads to divide the query heads; warn with the counts that would. */
export function checkKvHeads(heads: number, kvHeads: number, warn: Warn) {
  if (!isPositiveInt(heads) || !isPositiveInt(kvHeads)) return;
  if (kvHeads <= heads && heads % kvHeads === 0) return;
  const why =
    kvHeads > heads
      ? `there are more key/value heads (${kvHeads}) than query heads (${heads})`
      : `${heads} query heads do not split into ${kvHeads} equal groups`;
  warn(
    "kv_heads_not_divisor",
    `num_key_value_heads is ${kvHeads} but ${why}; every key/value head must serve the same number of query heads.`,
    `Check num_key_value_heads on the model card: with ${heads} query heads it is one of ${listWords(divisorsOf(heads))}. The profile cannot be saved until it divides the query heads.`,
  );
}
