import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { inverseFrequencies } from "../../../server/engine/frequencies";
import {
  cosineSum,
  gridBases,
  scanSupportedLength,
  supportedLength,
  supportedLengthNaive,
} from "../../../server/engine/base-bound";
import { smallestSupportingBase } from "../../../server/engine/base-search";
import { runMethod, METHODS } from "../../../server/engine";
import type { MethodId } from "../../../shared/schemas/analysis";
import { samplesFor } from "./fixtures";

// Men et al. 2024, "Base of RoPE Bounds Context Length": B(m) = Σ cos(m·θ_i), supported length = first m with B(m) < 0.
describe("supported length of a base (Men et al. 2024)", () => {
  it.each([
    [10_000, 1707],
    [500_000, 18438],
    [1_000_000, 27115],
  ])(
    "d = 128, b = %d → %d (derived in docs/rotary-scaling.md; the paper's rounded table is not used)",
    (base, expected) => {
      const theta = inverseFrequencies(128, base);
      expect(supportedLength(theta, 2 ** 24)).toBe(expected);
      expect(supportedLengthNaive(theta, expected + 1)).toBe(expected);
      expect(cosineSum(theta, expected)).toBeLessThan(0);
      expect(cosineSum(theta, expected - 1)).toBeGreaterThanOrEqual(0);
    },
  );

  it("returns null when no position below maxLength is negative, and respects maxLength exactly", () => {
    const theta = inverseFrequencies(128, 10_000);
    expect(supportedLength(theta, 1707)).toBeNull();
    expect(supportedLength(theta, 1708)).toBe(1707);
    expect(supportedLength(theta, 0)).toBeNull();
  });

  it("the fast scan gives exactly the plain scan's answer for random bases, dimensions and limits", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(2, 4, 8, 16, 32, 64, 128),
        fc.double({ min: 2, max: 5e6, noNaN: true }),
        fc.integer({ min: 1, max: 30_000 }),
        (d, base, maxLength) => {
          const theta = inverseFrequencies(d, base);
          expect(supportedLength(theta, maxLength)).toBe(supportedLengthNaive(theta, maxLength));
        },
      ),
      { numRuns: 60 },
    );
  });

  it("agrees with the plain scan on every method's scaled frequencies too (not only pure bases)", () => {
    const ctx = { d: 64, base: 10_000, trainedContext: 2048, targetContext: 16_384 };
    const samples = samplesFor(64);
    for (const id of Object.keys(METHODS) as MethodId[]) {
      const theta = Array.from(runMethod(ctx, samples[id]).invFreq);
      expect(supportedLength(theta, 60_000), id).toBe(supportedLengthNaive(theta, 60_000));
    }
  });

  it("a scan cut short by its evaluation budget says so, and every position below checkedUpTo really is non-negative", () => {
    const theta = inverseFrequencies(128, 1e8);
    const partial = scanSupportedLength(theta, 2 ** 24, { maxEvaluations: 200 });
    expect(partial.complete).toBe(false);
    expect(partial.supportedLength).toBeNull();
    expect(supportedLengthNaive(theta, partial.checkedUpTo)).toBeNull();
    const full = scanSupportedLength(theta, 2 ** 24);
    expect(full.complete).toBe(true);
    expect(full.supportedLength!).toBeGreaterThan(partial.checkedUpTo);
  });
});

describe("smallest supporting base on a grid", () => {
  const naiveSearch = (d: number, target: number, bases: number[]) =>
    bases.find((b) => supportedLengthNaive(inverseFrequencies(d, b), target) === null) ?? null;

  it("the default grid is 10^(k/100), k = 300 … 1000", () => {
    const bases = gridBases({ from: 1e3, to: 1e10, perDecade: 100 });
    expect(bases).toHaveLength(701);
    expect(bases[0]).toBe(1000);
    expect(bases[100]).toBe(10_000);
    expect(bases[700]).toBe(1e10);
  });

  it("matches a plain scan of every candidate, on several small targets", () => {
    const grid = { from: 1e2, to: 1e6, perDecade: 50 };
    for (const [d, target] of [
      [32, 500],
      [64, 2000],
      [128, 1700],
      [128, 4096],
    ]) {
      const fast = smallestSupportingBase(d, target, grid);
      expect(fast.smallestBase, `${d}/${target}`).toBe(naiveSearch(d, target, gridBases(grid)));
      expect(smallestSupportingBase(d, target, grid, { scan: supportedLengthNaive })).toEqual(fast);
    }
  });

  it("handles non-monotone validity: at target 1700 (d = 128) a grid base above the answer fails again", () => {
    const grid = { from: 1e3, to: 1e6, perDecade: 100 };
    const bases = gridBases(grid);
    const result = smallestSupportingBase(128, 1700, grid);
    expect(result.smallestBase).toBe(naiveSearch(128, 1700, bases));
    // 10 000 supports 1707 positions; 10^4.1 only 1649: validity is not monotone in the base
    expect(supportedLengthNaive(inverseFrequencies(128, 10 ** 4.1), 1700)).toBe(1649);
    const above = bases.filter((b) => b > result.smallestBase!);
    expect(above.some((b) => supportedLengthNaive(inverseFrequencies(128, b), 1700) !== null)).toBe(true);
    // a bisection assuming monotone validity would be misled; the upward scan examined candidates in order
    expect(result.candidatesExamined).toBe(bases.indexOf(result.smallestBase!) + 1);
  });

  it("reports null when no grid base supports the target, after examining all of them", () => {
    const grid = { from: 10, to: 100, perDecade: 10 };
    const r = smallestSupportingBase(128, 100_000, grid);
    expect(r).toEqual({ smallestBase: null, candidatesExamined: 11, candidatesTotal: 11 });
  });

  it("reports progress once per candidate", () => {
    const seen: number[] = [];
    smallestSupportingBase(
      64,
      2000,
      { from: 1e2, to: 1e5, perDecade: 20 },
      {
        onProgress: (n, total) => {
          seen.push(n);
          expect(total).toBe(61);
        },
      },
    );
    expect(seen).toEqual(Array.from({ length: seen.length }, (_, i) => i + 1));
  });
});
