/**
 * The open model library's rotary formulas, written from its source in our own words (huggingface/transformers,
 * src/transformers/modeling_rope_utils.py; which release reads which key is in the readers and docs/export-targets.md).
 * These are the consumer's formulas, kept apart from server/engine/methods on purpose: a reader that called our own
 * engine could never catch an export that the consumer reads differently. Float64 throughout; the library computes
 * θ in float32, which is what the 1e-6 "equivalent" tolerance allows for.
 */

/** `_compute_default_rope_parameters`: θ_i = 1 / base^(2i/d). */
export const defaultInvFreq = (d: number, base: number) =>
  Array.from({ length: Math.floor((d + 1) / 2) }, (_, i) => 1 / Math.pow(base, (2 * i) / d));

/** `_compute_dynamic_ntk_parameters`: L = max_position_embeddings, l = max(seq_len, L), base·(f·l/L − (f−1))^(d/(d−2)). */
export function dynamicInvFreq(d: number, base: number, factor: number, maxPos: number, seqLen: number) {
  const l = seqLen > maxPos ? seqLen : maxPos;
  return { invFreq: defaultInvFreq(d, base * Math.pow((factor * l) / maxPos - (factor - 1), d / (d - 2))), seqLen: l };
}

/** `get_mscale`: 1 for scale ≤ 1, else 0.1·m·ln(scale) + 1 (the ≤ 1 guard arrived with mscale; the 4.4x line has none). */
export const mscaleOf = (scale: number, m = 1, guard = true) =>
  guard && scale <= 1 ? 1 : 0.1 * m * Math.log(scale) + 1;

export interface YarnInputs {
  d: number;
  base: number;
  factor: number;
  /** the length the ramp is built from (find_correction_range's max_position_embeddings argument) */
  original: number;
  betaFast: number;
  betaSlow: number;
  /** floor/ceil the ramp ends (always on in the 4.4x line) */
  truncate: boolean;
}

/** `_compute_yarn_parameters`' frequency part: a ramp in the pair index between the two correction dimensions. */
export function yarnInvFreq(p: YarnInputs): number[] {
  const dimFor = (rotations: number) =>
    (p.d * Math.log(p.original / (rotations * 2 * Math.PI))) / (2 * Math.log(p.base));
  let low = dimFor(p.betaFast);
  let high = dimFor(p.betaSlow);
  if (p.truncate) [low, high] = [Math.floor(low), Math.ceil(high)];
  low = Math.max(low, 0);
  high = Math.min(high, p.d - 1);
  if (low === high) high += 0.001;
  return defaultInvFreq(p.d, p.base).map((extrapolation, j) => {
    const interpolation = extrapolation / p.factor;
    const ramp = Math.min(Math.max((j - low) / (high - low), 0), 1);
    const keep = 1 - ramp; // inv_freq_extrapolation_factor
    return interpolation * (1 - keep) + extrapolation * keep;
  });
}

/** `_compute_llama3_parameters`: wavelength bands around old_context_len / {low,high}_freq_factor. */
export function llama3InvFreq(d: number, base: number, factor: number, low: number, high: number, oldLen: number) {
  const lowWave = oldLen / low;
  const highWave = oldLen / high;
  return defaultInvFreq(d, base).map((f) => {
    const wave = (2 * Math.PI) / f;
    if (wave < highWave) return f;
    if (wave > lowWave) return f / factor;
    const smooth = (oldLen / wave - low) / (high - low);
    return ((1 - smooth) * f) / factor + smooth * f;
  });
}

/** `_compute_longrope_parameters`: θ_i / ext_i, and a = √(1 + ln f / ln original) when f > 1 unless given. */
export function longropeReading(
  d: number,
  base: number,
  ext: number[],
  factor: number,
  original: number,
  attention: number | undefined,
) {
  const attentionFactor = attention ?? (factor <= 1 ? 1 : Math.sqrt(1 + Math.log(factor) / Math.log(original)));
  return { invFreq: defaultInvFreq(d, base).map((f, i) => f / ext[i]), attentionFactor };
}
