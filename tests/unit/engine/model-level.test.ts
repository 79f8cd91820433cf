import { describe, expect, it } from "vitest";
import { criticalBase, criticalDimension, extrapolationBound } from "../../../server/engine/extrapolation";
import { decayCurve, decayPositions, relativeUpperBound } from "../../../server/engine/decay";
import { inverseFrequencies } from "../../../server/engine/frequencies";

// Liu et al. 2023, "Scaling Laws of RoPE-based Extrapolation".
describe("critical dimension and extrapolation bound (Liu et al. 2023)", () => {
  it("d = 128, b = 10 000, L = 4096 → d_extra = 92 (stated in the paper, Lemma 1)", () => {
    expect(criticalDimension(128, 10_000, 4096)).toBe(92);
  });

  it("T_extra = 2π·β^(d_extra/d): β = 10 000 → ≈ 4 712, β = 1 000 000 → ≈ 129 027 (Theorem 3; derived in docs/rotary-scaling.md)", () => {
    const at = (base: number) => extrapolationBound({ d: 128, originalBase: 10_000, trained: 4096, base, tune: 2048 });
    expect(at(10_000).tExtra).toBeCloseTo(4712, -1);
    expect(at(1_000_000).tExtra).toBeCloseTo(129_027, -1);
    // tuned at 2048 < L the critical base is below 10 000, so both bases are above it and the bound is T_extra
    expect(at(10_000).baseAboveCritical).toBe(true);
    expect(at(1_000_000).bound).toBe(at(1_000_000).tExtra);
  });

  it("critical base β_0 = b^(log_{L/2π}(T_tune/2π)): equals b when tuning at L, and gives the critical pair a period of T_tune (identity)", () => {
    expect(criticalBase(10_000, 4096, 4096)).toBeCloseTo(10_000, 8);
    const beta0 = criticalBase(10_000, 4096, 32_768);
    const x = (128 / 2) * (Math.log(4096 / (2 * Math.PI)) / Math.log(10_000)); // index whose period is L under b
    expect(2 * Math.PI * Math.pow(beta0, (2 * x) / 128)).toBeCloseTo(32_768, 6);
  });

  it("below the critical base the bound is the tuning length", () => {
    const r = extrapolationBound({ d: 128, originalBase: 10_000, trained: 4096, base: 10_000, tune: 32_768 });
    expect(r.baseAboveCritical).toBe(false);
    expect(r.bound).toBe(32_768);
  });
});

// Su et al. 2021 (RoFormer) §3.4.3.
describe("long-term decay R(m) (RoFormer)", () => {
  const theta = inverseFrequencies(128, 10_000);
  it.each([
    [0, 32.5],
    [1, 31.538],
    [10, 17.954],
    [100, 10.227],
    [1000, 4.471],
  ])("d = 128, b = 10 000: R(%d) = %d (derived in docs/rotary-scaling.md)", (m, r) => {
    expect(relativeUpperBound(theta, m)).toBeCloseTo(r, 3);
  });

  it("R(0) = (d/2 + 1)/2 for any frequencies: |S_j(0)| = j (identity)", () => {
    for (const d of [2, 16, 256]) expect(relativeUpperBound(inverseFrequencies(d, 123.4), 0)).toBe((d / 2 + 1) / 2);
  });

  it("positions are log-spaced integers from 0 that hit every power of ten and end exactly at the target", () => {
    const p = decayPositions(1_048_576);
    expect(p[0]).toBe(0);
    expect(p.at(-1)).toBe(1_048_576);
    for (const m of [1, 10, 100, 1000, 10_000, 100_000, 1_000_000]) expect(p).toContain(m);
    p.slice(1).forEach((m, i) => expect(m).toBeGreaterThan(p[i]));
    expect(decayCurve(theta, [0, 1000])).toEqual([32.5, relativeUpperBound(theta, 1000)]);
  });
});
