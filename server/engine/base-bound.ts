/**
 * Base lower bound (Men et al. 2024, "Base of RoPE Bounds Context Length"):
 * B(m) = Σ_i cos(m·θ_i); a base supports length L when B(m) ≥ 0 for every m < L.
 * The supported length of a set of frequencies is the first m with B(m) < 0.
 *
 * The fast scan returns exactly what the plain scan returns (tests compare them): every position it evaluates
 * is decided by the plain sum whenever the value is near zero, and every position it skips is proven ≥ 0
 * by a lower bound with a margin larger than any rounding difference between the two.
 */

/** B(m) summed in pair order with Math.cos: the reference both scans agree with. */
export function cosineSum(invFreq: ArrayLike<number>, m: number): number {
  let sum = 0;
  for (let i = 0; i < invFreq.length; i++) sum += Math.cos(m * invFreq[i]);
  return sum;
}

/** Plain scan from m = 0: first m < maxLength with B(m) < 0, or null. */
export function supportedLengthNaive(invFreq: ArrayLike<number>, maxLength: number): number | null {
  for (let m = 0; m < maxLength; m++) if (cosineSum(invFreq, m) < 0) return m;
  return null;
}

export interface ScanOptions {
  onProgress?: (position: number) => void;
  /** stop after this many evaluated positions (the analysis keeps its scan short; the worker has no limit) */
  maxEvaluations?: number;
}
export interface ScanResult {
  supportedLength: number | null;
  /** every m below this was proven to have B(m) ≥ 0 */
  checkedUpTo: number;
  /** false when maxEvaluations ran out first */
  complete: boolean;
}

const REANCHOR_EVERY = 256; // rotations between exact cos/sin re-evaluations; drift stays near 1e−13
const PROGRESS_EVERY = 4096; // evaluations between progress callbacks

/**
 * Margin covering (a) cos(fl(m·θ)) in the plain scan versus the exact rotation the recurrence tracks,
 * at most ulp(m·θ_i)/2 per pair, i.e. 2^−53·m·Σθ in total (with 8× headroom), and (b) recurrence drift.
 */
const marginAt = (m: number, sumTheta: number) => 1e-7 + 2 ** -50 * m * sumTheta;

/**
 * Fast scan. State per pair: (cos m·θ_i, sin m·θ_i), advanced by rotations through precomputed
 * (cos 2^k·θ_i, sin 2^k·θ_i). After each evaluation the scan skips ahead as far as a lower bound allows:
 * with the p highest-frequency pairs bounded by −1 and the rest by the Taylor bound
 * cos(x+h) ≥ cos x − h·sin x − h²/2, B(m+j) ≥ B(m) − Σ_{i<p}(1+cos x_i) − j·Σ_{i≥p}θ_i sin x_i − j²/2·Σ_{i≥p}θ_i².
 * That bound is concave in j, so where it is ≥ margin at j it is ≥ margin on all of [0, j].
 * The best p is taken per evaluation. (A plain |B'| ≤ Σθ bound is the p = 0, first-order case.)
 */
export function scanSupportedLength(invFreq: ArrayLike<number>, maxLength: number, opts: ScanOptions = {}): ScanResult {
  return scan(invFreq, maxLength, opts, null).result;
}

/**
 * The fast scan for `maxLength`, and whether its answer is the answer for every length of maxLength's octave
 * [2^K, 2^(K+1)) with the same options (`sameForOctave`). Lengths of one octave share K; they differ only in the
 * margin (marginAt grows with the length) and in the two end-of-range tests. Along the scan, each decision is checked
 * against the whole octave's margins [μ_lo, μ_hi] at once:
 * - the near-zero test `B < margin && B(m) < 0` gives the same outcome for every margin in range (B ≥ μ_hi, B < μ_lo,
 *   or B(m) ≥ 0);
 * - the jump: the slack B − margin is rounded monotonically in the margin; safeSteps is, in exact arithmetic on its
 *   (slack-independent) float inputs, non-decreasing in the slack (each root grows with D, and more pairs p count as
 *   D grows), and its float value is within a relative 8·2^−53 of that exact value (every sum it rounds has
 *   non-negative terms). So with `best` evaluated at both ends of the slack range and widened by OCTAVE_SLACK, the
 *   jump 2^k is the same for every margin when both widened ends give the same k;
 * - the end-of-range tests never fire: every position evaluated is below 2^K, and every jump's largest possible step
 *   is shorter than 2^K − m.
 * When one check fails the answer still holds for maxLength (nothing on its path changed), just not for the octave.
 */
export function scanOverOctave(invFreq: ArrayLike<number>, maxLength: number, opts: ScanOptions = {}) {
  const K = octaveOf(maxLength);
  return scan(invFreq, maxLength, opts, { lo: 2 ** K, hi: 2 ** (K + 1) - 1 });
}

/** K with 2^K ≤ n < 2^(K+1) (0 for n < 2): the octave of n, and the scan's largest jump 2^K. */
export function octaveOf(n: number): number {
  let K = 0;
  while (2 ** (K + 1) <= n) K++;
  return K;
}

/** Widening of the jump's bounds over an octave: far above safeSteps' rounding (8·2^−53 ≈ 8.9e−16, see above). */
const OCTAVE_SLACK = 1e-12;

function scan(
  invFreq: ArrayLike<number>,
  maxLength: number,
  opts: ScanOptions,
  octave: { lo: number; hi: number } | null,
): { result: ScanResult; sameForOctave: boolean } {
  const n = invFreq.length;
  const budget = opts.maxEvaluations ?? Infinity;
  let same = octave !== null;
  const done = (result: ScanResult) => ({ result, sameForOctave: same });
  const found = (m: number) => done({ supportedLength: m, checkedUpTo: m, complete: true });
  // reaching maxLength depends on maxLength: never the same for the octave
  const none = () => ((same = false), done({ supportedLength: null, checkedUpTo: maxLength, complete: true }));
  if (maxLength <= 0) return none();
  const K = octaveOf(maxLength);
  // rotation tables by 2^k, filled only up to the largest jump used (short scans never pay for long jumps)
  const powCos = new Float64Array((K + 1) * n),
    powSin = new Float64Array((K + 1) * n);
  let builtK = -1;
  const buildUpTo = (k: number) => {
    for (; builtK < k; builtK++) {
      const o = (builtK + 1) * n,
        h = 2 ** (builtK + 1);
      for (let i = 0; i < n; i++) {
        powCos[o + i] = Math.cos(h * invFreq[i]);
        powSin[o + i] = Math.sin(h * invFreq[i]);
      }
    }
  };
  const tailSq = new Float64Array(n + 1); // Σ_{i≥p} θ_i²
  let sumTheta = 0;
  for (let i = n - 1; i >= 0; i--) {
    tailSq[i] = tailSq[i + 1] + invFreq[i] * invFreq[i];
    sumTheta += invFreq[i];
  }
  const margin = marginAt(maxLength, sumTheta);
  const marginLo = octave ? marginAt(octave.lo, sumTheta) : margin,
    marginHi = octave ? marginAt(octave.hi, sumTheta) : margin;
  const jumpOf = (safe: number) => Math.min(K, 31 - Math.clz32(Math.floor(safe) + 1));

  const c = new Float64Array(n),
    s = new Float64Array(n);
  let m = 0,
    sinceAnchor = REANCHOR_EVERY,
    evaluations = 0;
  while (m < maxLength) {
    if (sinceAnchor >= REANCHOR_EVERY) {
      for (let i = 0; i < n; i++) {
        c[i] = Math.cos(m * invFreq[i]);
        s[i] = Math.sin(m * invFreq[i]);
      }
      sinceAnchor = 0;
    }
    let B = 0;
    for (let i = 0; i < n; i++) B += c[i];
    if (same) {
      if (m >= octave!.lo) same = false;
      else if (B >= marginLo && B < marginHi && cosineSum(invFreq, m) < 0) same = false;
    }
    if (B < margin && cosineSum(invFreq, m) < 0) return found(m);
    if (++evaluations >= budget) return done({ supportedLength: null, checkedUpTo: m + 1, complete: false });
    if (opts.onProgress && evaluations % PROGRESS_EVERY === 0) opts.onProgress(m);

    const safe = safeSteps(invFreq, c, s, tailSq, B - margin);
    const step = Math.floor(safe) + 1; // positions m+1 … m+step−1 are proven non-negative
    if (step >= maxLength - m) return none();
    const k = Math.min(K, 31 - Math.clz32(step));
    if (same) {
      const least = safeSteps(invFreq, c, s, tailSq, B - marginHi) * (1 - OCTAVE_SLACK);
      const most = safeSteps(invFreq, c, s, tailSq, B - marginLo) * (1 + OCTAVE_SLACK);
      if (jumpOf(least) !== k || jumpOf(most) !== k || Math.floor(most) + 1 >= octave!.lo - m) same = false;
    }
    if (k > builtK) buildUpTo(k);
    const o = k * n;
    for (let i = 0; i < n; i++) {
      const ci = c[i],
        si = s[i],
        a = powCos[o + i],
        b = powSin[o + i];
      c[i] = ci * a - si * b;
      s[i] = si * a + ci * b;
    }
    m += 2 ** k;
    sinceAnchor++;
  }
  return none();
}

/** Fast scan to the end: first m < maxLength with B(m) < 0, or null; same answers as supportedLengthNaive. */
export const supportedLength = (
  invFreq: ArrayLike<number>,
  maxLength: number,
  onProgress?: (position: number) => void,
) => scanSupportedLength(invFreq, maxLength, { onProgress }).supportedLength;

/** Largest j with the lower bound on B(m+j) still ≥ margin (0 when B itself is within the margin). */
function safeSteps(
  theta: ArrayLike<number>,
  c: Float64Array,
  s: Float64Array,
  tailSq: Float64Array,
  slack: number,
): number {
  const n = theta.length;
  let slope = 0; // Σ_{i≥p} θ_i sin x_i
  for (let i = 0; i < n; i++) slope += theta[i] * s[i];
  let best = 0,
    lost = 0; // lost = Σ_{i<p} (1 + cos x_i)
  for (let p = 0; p < n; p++) {
    const D = slack - lost;
    if (D <= 0) break;
    const a = tailSq[p];
    const root = Math.sqrt(slope * slope + 2 * a * D);
    // roots of a/2·j² + slope·j − D = 0, in the form that does not cancel
    const j = slope >= 0 ? (2 * D) / (slope + root) : (root - slope) / a;
    if (j > best) best = j;
    lost += 1 + c[p];
    slope -= theta[p] * s[p];
  }
  return best;
}

export interface BaseGrid {
  from: number;
  to: number;
  perDecade: number;
}
/** 10^(k/100) for integer k, 10^3 … 10^10. */
export const DEFAULT_BASE_GRID: BaseGrid = { from: 1e3, to: 1e10, perDecade: 100 };

/** Candidate bases 10^(k/perDecade), integer k, within [from, to], ascending. */
export function gridBases(grid: BaseGrid): number[] {
  const kFrom = Math.ceil(grid.perDecade * Math.log10(grid.from) - 1e-9);
  const kTo = Math.floor(grid.perDecade * Math.log10(grid.to) + 1e-9);
  const out: number[] = [];
  for (let k = kFrom; k <= kTo; k++) out.push(10 ** (k / grid.perDecade));
  return out;
}
