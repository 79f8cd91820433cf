/**
 * The rotary formulas of the Python serving engines, restated from their source (docs/export-targets-engines.md).
 * vLLM and SGLang share one lineage (SGLang's rotary files say "adapted from vLLM v0.6.6.post1"); where they differ,
 * the caller passes the difference in. Written apart from server/engine/methods on purpose: a reader that reused the
 * engine's own formulas could only ever agree with it.
 */

/** θ_i = b^(−2i/d), i < d/2: `_compute_inv_freq` in vllm-project/vllm vllm/model_executor/layers/rotary_embedding/base.py (072d10a). */
export function plainInvFreq(d: number, base: number): number[] {
  return Array.from({ length: d / 2 }, (_, i) => 1 / Math.pow(base, (2 * i) / d));
}

/**
 * Dynamic NTK as both engines build it: the cache is made once, for max_len = max_position × factor, with
 * base · (factor·max_len/max_position − (factor − 1))^(d/(d−2)) = base · (f² − f + 1)^(d/(d−2)); the base never changes
 * while serving. vLLM dynamic_ntk_scaling_rope.py (50feac9); SGLang rotary_embedding/_base.py (01e3ddd).
 */
export const staticDynamicBase = (base: number, factor: number, d: number) =>
  base * Math.pow(factor * factor - (factor - 1), d / (d - 2));

/** YaRN's magnitude g(s, m) = 0.1·m·ln s + 1, 1 for s ≤ 1: `yarn_get_mscale` (vLLM common.py 002d181; SGLang yarn.py 8448045). */
export const yarnGetMscale = (scale: number, mscale = 1) => (scale <= 1 ? 1 : 0.1 * mscale * Math.log(scale) + 1);

/** Pair index that makes `rotations` turns in `length` tokens: `yarn_find_correction_dim` (same files). */
const correctionDim = (rotations: number, d: number, base: number, length: number) =>
  (d * Math.log(length / (rotations * 2 * Math.PI))) / (2 * Math.log(base));

/**
 * YaRN frequencies as `YaRNScalingRotaryEmbedding._compute_inv_freq` builds them (vLLM yarn_scaling_rope.py 0cd5784,
 * SGLang yarn.py 8448045): ramp ends at the correction dims for β_fast and β_slow, floored/ceiled when `truncate`,
 * clamped to [0, d−1]; mask = 1 − clamp((j − low)/(high − low)); θ′ = θ/s·(1 − mask·e) + θ·mask·e with e the
 * extrapolation factor (SGLang only; vLLM has none, e = 1).
 */
export function yarnInvFreq(
  d: number,
  base: number,
  factor: number,
  original: number,
  betaFast: number,
  betaSlow: number,
  truncate: boolean,
  extrapolationFactor = 1,
): number[] {
  let low = correctionDim(betaFast, d, base, original);
  let high = correctionDim(betaSlow, d, base, original);
  if (truncate) [low, high] = [Math.floor(low), Math.ceil(high)];
  low = Math.max(low, 0);
  high = Math.min(high, d - 1);
  if (low === high) high += 0.001;
  return plainInvFreq(d, base).map((theta, j) => {
    const ramp = Math.min(Math.max((j - low) / (high - low), 0), 1);
    const mask = (1 - ramp) * extrapolationFactor;
    return (theta / factor) * (1 - mask) + theta * mask;
  });
}

/**
 * The llama3 band rule as `Llama3RotaryEmbedding._compute_inv_freq` (vLLM llama3_rope.py 045d757; SGLang
 * rope_variant.py 0b1fd02): wavelengths under original/high kept, over original/low divided by the factor, smooth blend
 * between; equal low and high factors make the blend weight 0.
 */
export function llama3InvFreq(d: number, base: number, factor: number, low: number, high: number, original: number) {
  const lowWave = original / low;
  const highWave = original / high;
  return plainInvFreq(d, base).map((theta) => {
    const wave = (2 * Math.PI) / theta;
    if (wave < highWave) return theta;
    if (wave > lowWave) return theta / factor;
    const smooth = low !== high ? (original / wave - low) / (high - low) : 0;
    return ((1 - smooth) * theta) / factor + smooth * theta;
  });
}

/**
 * LongRoPE as `Phi3LongRoPEScaledRotaryEmbedding` (vLLM phi3_long_rope_scaled_rope.py 17d618b; SGLang rope_variant.py
 * 0b1fd02): θ′_i = θ_i / e_i; the magnitude is √(1 + ln(max/original)/ln original) when max > original, else 1, unless
 * short_mscale / long_mscale are given.
 */
export function longropeReading(
  d: number,
  base: number,
  factors: number[],
  maxPosition: number,
  original: number,
  explicitMscale: number | undefined,
) {
  if (factors.length !== d / 2) throw new Error(`LongRoPE needs ${d / 2} factors, the block has ${factors.length}`);
  const scale = maxPosition / original;
  const mscale = explicitMscale ?? (scale <= 1 ? 1 : Math.sqrt(1 + Math.log(scale) / Math.log(original)));
  return { invFreq: plainInvFreq(d, base).map((t, i) => t / factors[i]), attentionFactor: mscale };
}
