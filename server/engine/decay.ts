/**
 * Long-term decay of RoPE (Su et al. 2021, RoFormer §3.4.3):
 * R(m) = (1/(d/2))·Σ_{j=1}^{d/2} |S_j(m)|, S_j(m) = Σ_{i<j} e^{i·m·θ_i}.
 * One pass over the pairs with a running complex sum gives every S_j.
 */
export function relativeUpperBound(invFreq: ArrayLike<number>, m: number): number {
  let re = 0,
    im = 0,
    acc = 0;
  for (let i = 0; i < invFreq.length; i++) {
    const a = m * invFreq[i];
    re += Math.cos(a);
    im += Math.sin(a);
    acc += Math.sqrt(re * re + im * im);
  }
  return acc / invFreq.length;
}

/**
 * Integer positions 0, 1, then ≈ 10^(k/perDecade), deduplicated, ending exactly at `upTo`.
 * Powers of ten are on the grid, so R(10), R(100), … can be read off directly.
 */
export function decayPositions(upTo: number, perDecade = 16): number[] {
  const out = [0];
  for (let k = 0; ; k++) {
    const m = Math.round(Math.pow(10, k / perDecade));
    if (m >= upTo) break;
    if (m > out[out.length - 1]) out.push(m);
  }
  if (upTo > out[out.length - 1]) out.push(upTo);
  return out;
}

export const decayCurve = (invFreq: ArrayLike<number>, positions: number[]) =>
  positions.map((m) => relativeUpperBound(invFreq, m));
