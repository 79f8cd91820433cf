import { octaveOf, scanOverOctave, type ScanResult } from "./base-bound";
import { relativeUpperBound } from "./decay";
import { inverseFrequencies } from "./frequencies";

/*
 * Pure sub-results of an analysis that repeat between different questions, kept in this process
 * (docs/scale-figures.md "New questions: what repeats between them"). Every entry is found by everything its value
 * depends on, down to the bits of each frequency (a hash finds the entry, a bit-for-bit comparison of the kept
 * frequencies confirms it), so a kept value is exactly what the computation would return:
 *
 * - θ_i = b^(−2i/d) depends on (d, b) only: the model's frequencies, and every method's starting point, are computed
 *   once per model instead of once per method and request (nine times in an 8-method analysis).
 * - R(m) of a frequency set depends on that set and m only. A new target moves only the last of the ~90 decay
 *   positions, and the unscaled curve, `default`'s, `base`'s and LongRoPE's (explicit factors) do not move with the
 *   target at all: each set's last curve is kept, and a position it shares with the new one is not computed again.
 * - The analysis's bounded base scan depends on the frequencies, the target and the evaluation budget; within one
 *   octave of targets [2^K, 2^(K+1)) it mostly takes the same path, and when it proves that (base-bound.ts,
 *   scanOverOctave) its answer is kept for the octave, else for the target alone.
 *
 * Bounds: 64 models' frequencies, 256 frequency sets' last curves, 256 scans: well under 1 MB at d = 128.
 */

/** A Map holding at most `max` entries, dropping the least recently used (the engine imports no packages). */
class Recent<K, V> {
  readonly #map = new Map<K, V>();
  constructor(readonly max: number) {}
  get(key: K): V | undefined {
    const v = this.#map.get(key);
    if (v !== undefined) {
      this.#map.delete(key);
      this.#map.set(key, v);
    }
    return v;
  }
  set(key: K, value: V) {
    this.#map.delete(key);
    this.#map.set(key, value);
    if (this.#map.size > this.max) this.#map.delete(this.#map.keys().next().value as K);
  }
  clear() {
    this.#map.clear();
  }
}

/** A frequency set as the kept entries compare it: its own copy of the values and a hash of their bits. */
export interface FrequencySet {
  readonly values: Float64Array;
  readonly hash: number;
}

export function frequencySet(invFreq: ArrayLike<number>): FrequencySet {
  const values = Float64Array.from(invFreq);
  const words = new Uint32Array(values.buffer);
  // FNV-1a over the 32-bit words: finds the entry; sameBits decides.
  let hash = 0x811c9dc5;
  for (let i = 0; i < words.length; i++) hash = Math.imul(hash ^ words[i], 0x01000193);
  return { values, hash: hash >>> 0 };
}

/** Whether two sets hold the same doubles, bit for bit. */
export function sameBits(a: FrequencySet, b: FrequencySet): boolean {
  if (a.hash !== b.hash || a.values.length !== b.values.length) return false;
  const x = new Uint32Array(a.values.buffer),
    y = new Uint32Array(b.values.buffer);
  for (let i = 0; i < x.length; i++) if (x[i] !== y[i]) return false;
  return true;
}

const frequencies = new Recent<string, Float64Array>(64);

/** inverseFrequencies(d, base), computed once per (d, base); each caller gets its own copy. */
export function modelFrequencies(d: number, base: number): Float64Array {
  // String(number) is the shortest text that reads back as the same double, so the key is exact.
  const key = `${d}|${base}`;
  let kept = frequencies.get(key);
  if (!kept) frequencies.set(key, (kept = inverseFrequencies(d, base)));
  return kept.slice();
}

interface Curve {
  set: FrequencySet;
  positions: readonly number[];
  values: readonly number[];
}
const curves = new Recent<number, Curve>(256);

/** decayCurve(set, positions) (decay.ts); R(m) at a position the set's last curve had is taken from it. */
export function keptDecayCurve(set: FrequencySet, positions: readonly number[]): number[] {
  const last = curves.get(set.hash);
  const kept = last && sameBits(last.set, set) ? last : null;
  const values = positions.map((m, i) =>
    kept && i < kept.positions.length && kept.positions[i] === m ? kept.values[i] : relativeUpperBound(set.values, m),
  );
  curves.set(set.hash, { set, positions: positions.slice(), values: values.slice() });
  return values;
}

const scans = new Recent<string, { set: FrequencySet; scan: ScanResult }>(256);

/**
 * scanSupportedLength(set, maxLength, { maxEvaluations }), kept per exact frequency set, budget and either the octave
 * of maxLength, when the scan proved its answer the same for every length of it (scanOverOctave in base-bound.ts),
 * or else maxLength itself.
 */
export function keptScan(set: FrequencySet, maxLength: number, maxEvaluations: number): ScanResult {
  const octaveKey = `${set.hash}|octave ${octaveOf(maxLength)}|${maxEvaluations}`;
  const lengthKey = `${set.hash}|${maxLength}|${maxEvaluations}`;
  for (const key of [octaveKey, lengthKey]) {
    const kept = scans.get(key);
    if (kept && sameBits(kept.set, set)) return { ...kept.scan };
  }
  const { result, sameForOctave } = scanOverOctave(set.values, maxLength, { maxEvaluations });
  scans.set(sameForOctave ? octaveKey : lengthKey, { set, scan: result });
  return { ...result };
}

/** Tests: every sub-result is computed afresh. */
export function forgetEngineMemo() {
  frequencies.clear();
  curves.clear();
  scans.clear();
}
