import { scanSupportedLength, type ScanResult } from "./base-bound";
import { relativeUpperBound } from "./decay";
import { inverseFrequencies } from "./frequencies";

/*
 * Pure sub-results of an analysis that repeat between different questions, kept in this process
 * (docs/scale-figures.md "New questions: what repeats between them"). Every entry is keyed by everything its value
 * depends on, down to the bits of each frequency, so a kept value is exactly what the computation would return:
 *
 * - θ_i = b^(−2i/d) depends on (d, b) only: the model's frequencies, and every method's starting point, are computed
 *   once per model instead of once per method and request (nine times in an 8-method analysis).
 * - R(m) of a frequency set depends on that set and m only. A new target moves only the last of the ~90 decay
 *   positions, and the unscaled curve, `default`'s, `base`'s and LongRoPE's (explicit factors) do not move with the
 *   target at all; each of those is computed once per set and position.
 * - The analysis's bounded base scan depends on the frequencies, the target and the evaluation budget: a question
 *   changing only its methods or bands asks it again.
 *
 * Bounds: 64 models' frequencies, 256 frequency sets of decay values of up to 1 024 positions each, 256 scans: at
 * most about 10 MB. A frequency set's decay values are kept from its second sighting on, so sets seen once (a scaled
 * set for one target) cost one key and nothing else.
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

/** The exact bits of a frequency set, as a string (two sets share a key only when every value is the same double). */
export function frequencyKey(invFreq: ArrayLike<number>): string {
  const f = invFreq instanceof Float64Array ? invFreq : Float64Array.from(invFreq);
  const units = new Uint16Array(f.buffer, f.byteOffset, f.length * 4);
  let key = "";
  for (let i = 0; i < units.length; i += 4096) key += String.fromCharCode(...units.subarray(i, i + 4096));
  return key;
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

/** Positions kept per frequency set; past it, further positions are computed but not kept. */
const POSITIONS_PER_SET = 1024;
/** Marks a frequency set seen once: its values are kept from the second sighting on. */
const SEEN_ONCE = "seen once";
const decayValues = new Recent<string, Map<number, number> | typeof SEEN_ONCE>(256);

/** decayCurve(invFreq, positions) (decay.ts), each R(m) computed once per exact frequency set and position. */
export function keptDecayCurve(invFreq: ArrayLike<number>, positions: readonly number[], key = frequencyKey(invFreq)) {
  let byPosition = decayValues.get(key);
  if (byPosition === undefined) {
    decayValues.set(key, SEEN_ONCE);
    return positions.map((m) => relativeUpperBound(invFreq, m));
  }
  if (byPosition === SEEN_ONCE) decayValues.set(key, (byPosition = new Map()));
  const kept = byPosition;
  return positions.map((m) => {
    let r = kept.get(m);
    if (r === undefined) {
      r = relativeUpperBound(invFreq, m);
      if (kept.size < POSITIONS_PER_SET) kept.set(m, r);
    }
    return r;
  });
}

const scans = new Recent<string, ScanResult>(256);

/** scanSupportedLength(invFreq, maxLength, { maxEvaluations }) kept per exact frequency set, length and budget. */
export function keptScan(
  invFreq: ArrayLike<number>,
  maxLength: number,
  maxEvaluations: number,
  key = frequencyKey(invFreq),
) {
  const full = `${maxLength}|${maxEvaluations}|${key}`;
  let kept = scans.get(full);
  if (!kept) scans.set(full, (kept = scanSupportedLength(invFreq, maxLength, { maxEvaluations })));
  return { ...kept };
}

/** Tests: every sub-result is computed afresh. */
export function forgetEngineMemo() {
  frequencies.clear();
  decayValues.clear();
  scans.clear();
}
