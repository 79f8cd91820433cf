/** θ_i = b^(−2i/d), i = 0 … d/2−1 (Su et al. 2021, RoFormer, Eq. 15). */
export function inverseFrequencies(d: number, base: number): Float64Array {
  const out = new Float64Array(d / 2);
  for (let i = 0; i < d / 2; i++) out[i] = Math.pow(base, (-2 * i) / d);
  return out;
}

/** λ = 2π/θ tokens per full rotation. */
export const wavelength = (invFreq: number) => (2 * Math.PI) / invFreq;

/**
 * Rotates a vector of length d pair by pair, (x_2i, x_2i+1) by angle m·θ_i (RoFormer Eq. 34, interleaved layout).
 * Used to check the relative-position property; the layout does not change any result the engine reports.
 */
export function rotate(vec: ArrayLike<number>, position: number, invFreq: ArrayLike<number>): Float64Array {
  const out = new Float64Array(vec.length);
  for (let i = 0; i < invFreq.length; i++) {
    const angle = position * invFreq[i];
    const c = Math.cos(angle),
      s = Math.sin(angle);
    const x = vec[2 * i],
      y = vec[2 * i + 1];
    out[2 * i] = x * c - y * s;
    out[2 * i + 1] = x * s + y * c;
  }
  return out;
}
