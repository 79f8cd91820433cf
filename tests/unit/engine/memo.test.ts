import { beforeEach, describe, expect, it } from "vitest";
import fc from "fast-check";
import { octaveOf, scanOverOctave, scanSupportedLength } from "../../../server/engine/base-bound";
import { inverseFrequencies } from "../../../server/engine/frequencies";
import { analyse } from "../../../server/engine";
import { relativeUpperBound } from "../../../server/engine/decay";
import {
  forgetEngineMemo,
  sameBits,
  frequencySet,
  keptDecayCurve,
  keptScan,
  modelFrequencies,
} from "../../../server/engine/memo";
import { resolvedAnalysisRequestSchema } from "../../../shared/schemas/analysis";

// The engine's kept sub-results (server/engine/memo.ts) are keyed by everything they depend on: questions differing in
// any one key field get their own, correct value. Each value is asked several times (a kept value is used from the
// second or third asking on) and checked against a hand value or an identity, never against an earlier answer.
const ASKED = 3;
const ask = <T>(f: () => T): T => {
  let last = f();
  for (let i = 1; i < ASKED; i++) last = f();
  return last;
};

/**
 * Two pairs: S_1 = e^{imθ0}, S_2 = e^{imθ0} + e^{imθ1}, so |S_1| = 1 and |S_2| = 2|cos(m(θ0 − θ1)/2)|, and
 * R(m) = (1 + 2|cos(m(θ0 − θ1)/2)|)/2 (RoFormer §3.4.3 with d/2 = 2).
 */
const twoPairR = (t0: number, t1: number, m: number) => (1 + 2 * Math.abs(Math.cos((m * (t0 - t1)) / 2))) / 2;

beforeEach(() => forgetEngineMemo());

describe("kept model frequencies θ_i = b^(−2i/d) (RoFormer Eq. 15)", () => {
  it("differ with d and with the base", () => {
    const a = ask(() => modelFrequencies(4, 10_000));
    const b = ask(() => modelFrequencies(8, 10_000));
    const c = ask(() => modelFrequencies(4, 100));
    [1, 0.01].forEach((v, i) => expect(a[i]).toBeCloseTo(v, 15));
    [1, 0.1, 0.01, 0.001].forEach((v, i) => expect(b[i]).toBeCloseTo(v, 15));
    [1, 0.1].forEach((v, i) => expect(c[i]).toBeCloseTo(v, 15));
    expect(a).toHaveLength(2);
  });

  it("hand each caller its own copy", () => {
    const first = modelFrequencies(4, 10_000);
    first[1] = 42;
    expect(modelFrequencies(4, 10_000)[1]).toBeCloseTo(0.01, 15);
  });
});

describe("kept decay values R(m)", () => {
  it("differ with the frequency set and with the position", () => {
    const positions = [2, 3];
    const half = ask(() => keptDecayCurve(frequencySet([1, 0.5]), positions));
    const quarter = ask(() => keptDecayCurve(frequencySet([1, 0.25]), positions));
    positions.forEach((m, i) => {
      expect(half[i]).toBeCloseTo(twoPairR(1, 0.5, m), 14);
      expect(quarter[i]).toBeCloseTo(twoPairR(1, 0.25, m), 14);
    });
    expect(half[0]).not.toBeCloseTo(quarter[0], 6);
    expect(half[0]).not.toBeCloseTo(half[1], 6);
    // one pair: |S_1| = 1 at every position
    for (const r of ask(() => keptDecayCurve(frequencySet([0.3]), [0, 7, 1000]))) expect(r).toBeCloseTo(1, 15);
  });

  it("tell apart sets that differ only in the last bit of one value", () => {
    const t1 = 0.5 + 2 ** -53;
    expect(sameBits(frequencySet([1, 0.5]), frequencySet([1, t1]))).toBe(false);
    expect(sameBits(frequencySet([1, 0.5]), frequencySet(Float64Array.of(1, 0.5)))).toBe(true);
    expect(sameBits(frequencySet([0]), frequencySet([-0]))).toBe(false);
    const m = 1e9;
    // the kept value is the pure function's: the same as evaluating R directly, for both sets
    const a = ask(() => keptDecayCurve(frequencySet([1, 0.5]), [m]))[0];
    const b = ask(() => keptDecayCurve(frequencySet([1, t1]), [m]))[0];
    expect(a).toBe(relativeUpperBound([1, 0.5], m));
    expect(b).toBe(relativeUpperBound([1, t1], m));
  });

  it("computes a position the set's last curve did not have (a new target's last position)", () => {
    const set = frequencySet([1, 0.5]);
    ask(() => keptDecayCurve(set, [0, 2, 3]));
    const moved = keptDecayCurve(set, [0, 2, 5]);
    [0, 2, 5].forEach((m, i) => expect(moved[i]).toBeCloseTo(twoPairR(1, 0.5, m), 14));
    const shorter = keptDecayCurve(set, [0, 7]);
    [0, 7].forEach((m, i) => expect(shorter[i]).toBeCloseTo(twoPairR(1, 0.5, m), 14));
  });
});

describe("kept base scans (Men et al. 2024: first m with Σ cos(m·θ_i) < 0)", () => {
  // One pair: cos(mθ) < 0 first at m = ⌈π/(2θ)⌉ when π/(2θ) is not an integer: θ = 1/1000 → 1571, θ = 1/100 → 158.
  it("differ with the frequencies, the length and the budget", () => {
    expect(ask(() => keptScan(frequencySet([1 / 1000]), 2000, 4000))).toEqual({
      supportedLength: 1571,
      checkedUpTo: 1571,
      complete: true,
    });
    expect(ask(() => keptScan(frequencySet([1 / 100]), 2000, 4000))).toMatchObject({
      supportedLength: 158,
      complete: true,
    });
    // a length short of the first negative position: none found, every m below it checked
    expect(ask(() => keptScan(frequencySet([1 / 1000]), 1000, 4000))).toEqual({
      supportedLength: null,
      checkedUpTo: 1000,
      complete: true,
    });
    // a budget of one evaluation: only m = 0 (B = 1) was looked at
    expect(ask(() => keptScan(frequencySet([1 / 1000]), 2000, 1))).toEqual({
      supportedLength: null,
      checkedUpTo: 1,
      complete: false,
    });
  });
});

describe("base scans kept for an octave of targets", () => {
  // Men et al. 2024 (derived in docs/rotary-scaling.md, pinned in base-bound.test.ts): at d = 128 the support of
  // b = 500 000 ends at 18 438, of b = 10 000 at 1 707; below that the whole range is supported.
  it("answers every target of the octave with the support's end, and a target below it with the whole range", () => {
    const set = frequencySet(inverseFrequencies(128, 500_000));
    for (const target of [2 ** 20, 2 ** 20 + 1, 1_500_000, 2 ** 21 - 1])
      expect(keptScan(set, target, 4000)).toEqual({ supportedLength: 18_438, checkedUpTo: 18_438, complete: true });
    expect(keptScan(set, 4096, 4000)).toEqual({ supportedLength: null, checkedUpTo: 4096, complete: true });
    const other = frequencySet(inverseFrequencies(128, 10_000));
    expect(keptScan(other, 2 ** 20 + 5, 4000)).toMatchObject({ supportedLength: 1707, complete: true });
    // another budget is another entry: one evaluation looks at m = 0 only
    expect(keptScan(set, 2 ** 20 + 2, 1)).toEqual({ supportedLength: null, checkedUpTo: 1, complete: false });
  });

  // The octave proof's claim, checked on random models, targets and budgets: when the scan says its answer holds for
  // the octave, the plain scan at any other length of that octave gives exactly that answer.
  it("an answer proven for the octave is the scan's answer at every length of it", () => {
    let proven = 0;
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 96 }),
        fc.double({ min: 3, max: 9, noNaN: true }),
        fc.integer({ min: 10, max: 24 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.integer({ min: 1, max: 4000 }),
        (pairs, log10Base, K, at, other, budget) => {
          const theta = inverseFrequencies(2 * pairs, 10 ** log10Base);
          const length = 2 ** K + Math.floor(at * (2 ** K - 1));
          const { result, sameForOctave } = scanOverOctave(theta, length, { maxEvaluations: budget });
          expect(octaveOf(length)).toBe(K);
          expect(result).toEqual(scanSupportedLength(theta, length, { maxEvaluations: budget }));
          if (sameForOctave) proven++;
          if (sameForOctave)
            for (const elsewhere of [2 ** K, 2 ** (K + 1) - 1, 2 ** K + Math.floor(other * (2 ** K - 1))])
              expect(scanSupportedLength(theta, elsewhere, { maxEvaluations: budget })).toEqual(result);
        },
      ),
      { numRuns: 150 },
    );
    // not vacuous: most scans prove their answer for the octave (about 80 % in a 2 000-run sample)
    expect(proven).toBeGreaterThan(75);
  });
});

describe("analyse() with kept sub-results", () => {
  // d = 4: θ = (1, b^(−1/2)). Support ends at the first m with cos m + cos(m·θ1) < 0: for b = 10 000 (θ1 = 0.01) at
  // m = 22 (cos 22 + cos 0.22 = −0.0241; cos 3 + cos 0.03 = +0.0096 just misses), for b = 100 (θ1 = 0.1) at m = 3
  // (cos 3 + cos 0.3 = −0.0347; cos 2 + cos 0.2 = +0.564).
  const question = (targetContext: number, ropeTheta = 10_000) =>
    resolvedAnalysisRequestSchema.parse({
      model: { headDim: 4, ropeTheta, trainedContext: 64 },
      targetContext,
      methods: [{ method: "default" }, { method: "linear" }],
    });

  it("answers each target and base with its own decay curve and scan", () => {
    for (const [target, base] of [
      [256, 10_000],
      [257, 10_000],
      [256, 100],
    ] as const) {
      const res = ask(() => analyse(question(target, base)));
      const t1 = base === 10_000 ? 0.01 : 0.1;
      const last = res.decay.positions.length - 1;
      expect(res.decay.positions[last]).toBe(target);
      expect(res.decay.original[last]).toBeCloseTo(twoPairR(1, t1, target), 12);
      // default RoPE leaves θ as it is: its curve is the unscaled one
      expect(res.decay.byMethod["0"]).toEqual(res.decay.original);
      // linear divides θ by s = L'/L
      const s = target / 64;
      expect(res.decay.byMethod["1"][last]).toBeCloseTo(twoPairR(1 / s, t1 / s, target), 12);
      expect(res.baseSupport).toMatchObject({ supportedLength: base === 10_000 ? 22 : 3, complete: true });
    }
  });
});
