import { describe, expect, it } from "vitest";
import { METHODS } from "../../../server/engine";
import { inverseFrequencies, wavelength } from "../../../server/engine/frequencies";
import { yarnMscale, yarnRampRange, correctionIndex } from "../../../server/engine/methods/yarn";
import { longropeAttentionFactor } from "../../../server/engine/methods/longrope";
import { CTX } from "./fixtures";

describe("YaRN (Peng et al. 2023)", () => {
  it("attention factor g(s) = 0.1·ln s + 1: s = 8 → 1.2079 (the paper quotes ≈ 1.208), s = 16 → 1.2773 (Eq. 22)", () => {
    expect(yarnMscale(8)).toBeCloseTo(1.2079, 4);
    expect(yarnMscale(16)).toBeCloseTo(1.2773, 4);
    expect(yarnMscale(1)).toBe(1);
    const out = METHODS.yarn({ ...CTX, targetContext: 8 * CTX.trainedContext }, { method: "yarn" });
    expect(out.attentionFactor).toBeCloseTo(1.2079, 4);
  });

  it("mscale / mscaleAllDim ratio only when both are set and non-zero; explicit attentionFactor wins (Eq. 22, implementation form)", () => {
    const ctx = { ...CTX, targetContext: 40 * CTX.trainedContext };
    const both = METHODS.yarn(ctx, { method: "yarn", mscale: 1, mscaleAllDim: 0.5 });
    expect(both.attentionFactor).toBeCloseTo((0.1 * Math.log(40) + 1) / (0.05 * Math.log(40) + 1), 14);
    // equal mscale and mscaleAllDim cancel: a = 1 (the DeepSeek-V3 configuration does this; from memory)
    expect(METHODS.yarn(ctx, { method: "yarn", mscale: 1, mscaleAllDim: 1 }).attentionFactor).toBe(1);
    expect(METHODS.yarn(ctx, { method: "yarn", mscale: 1 }).attentionFactor).toBeCloseTo(yarnMscale(40), 15);
    expect(
      METHODS.yarn(ctx, { method: "yarn", attentionFactor: 0.9, mscale: 1, mscaleAllDim: 2 }).attentionFactor,
    ).toBe(0.9);
  });

  it("ramp bounds for d = 128, b = 10 000, L = 4096 (derived by hand: c(32) = 20.94 → 20, c(1) = 45.03 → 46)", () => {
    expect(correctionIndex(32, 128, 1e4, 4096)).toBeCloseTo(20.944, 2);
    expect(correctionIndex(1, 128, 1e4, 4096)).toBeCloseTo(45.027, 2);
    expect(yarnRampRange(128, 1e4, 4096, 32, 1, true)).toEqual({ low: 20, high: 46 });
    const { low, high } = yarnRampRange(128, 1e4, 4096, 32, 1, false);
    expect(low).toBeCloseTo(20.944, 2);
    expect(high).toBeCloseTo(45.027, 2);
  });

  it("keeps pairs 0-20, divides 46-63 by s, and blends linearly in the index between (implementation form of Eqs. 17-22)", () => {
    const s = 16;
    const theta = inverseFrequencies(128, 1e4);
    const out = Array.from(METHODS.yarn({ ...CTX, targetContext: s * 4096 }, { method: "yarn" }).invFreq);
    for (let j = 0; j <= 20; j++) expect(out[j]).toBe(theta[j]);
    for (let j = 46; j < 64; j++) expect(out[j]).toBeCloseTo(theta[j] / s, 18);
    // j = 33 sits half-way along the ramp (33 − 20)/(46 − 20) = 0.5
    expect(out[33]).toBeCloseTo(0.5 * theta[33] + (0.5 * theta[33]) / s, 15);
  });
});

describe("band-smoothed scaling (Llama 3.1 rule, Meta 2024)", () => {
  // Published parameters: f = 8, low 1, high 4, L = 8192, b = 500 000, d = 128.
  const ctx = { d: 128, base: 500_000, trainedContext: 8192, targetContext: 8 * 8192 };
  const theta = inverseFrequencies(128, 500_000);
  const out = Array.from(METHODS.llama3(ctx, { method: "llama3" }).invFreq);
  const sigma = (j: number) => (out[j] / theta[j] - 1 / 8) / (1 - 1 / 8);

  it("pairs 0-28 unchanged, 29-34 blended, 35-63 divided by 8 (derived in docs/rotary-scaling.md)", () => {
    for (let j = 0; j <= 28; j++) expect(out[j]).toBe(theta[j]);
    for (let j = 29; j <= 34; j++) {
      expect(out[j]).toBeLessThan(theta[j]);
      expect(out[j]).toBeGreaterThan(theta[j] / 8);
    }
    for (let j = 35; j < 64; j++) expect(out[j]).toBe(theta[j] / 8);
  });

  it("σ = 0.804 at pair 29 and 0.075 at pair 34 (derived), and σ = (L/λ − 1)/3 between", () => {
    expect(sigma(29)).toBeCloseTo(0.804, 3);
    expect(sigma(34)).toBeCloseTo(0.075, 3);
    for (let j = 29; j <= 34; j++) expect(sigma(j)).toBeCloseTo((8192 / wavelength(theta[j]) - 1) / 3, 12);
  });
});

describe("LongRoPE (Ding et al. 2024)", () => {
  it("a = sqrt(1 + ln s / ln L): L = 4096, s = 32 gives sqrt(17/12) = 1.19024 (ln 32 / ln 4096 = 5/12; Phi-3-mini-128k ships 1.1902380714238083, from memory)", () => {
    expect(longropeAttentionFactor(32, 4096)).toBeCloseTo(Math.sqrt(17 / 12), 15);
    expect(longropeAttentionFactor(32, 4096)).toBeCloseTo(1.1902380714238083, 12);
    expect(longropeAttentionFactor(1, 4096)).toBe(1);
  });

  it("divides θ_i by the long factors when L' > L and by the short factors otherwise", () => {
    const longFactor = Array.from({ length: 64 }, (_, i) => 1 + i / 10);
    const shortFactor = Array.from({ length: 64 }, (_, i) => 1 + i / 100);
    const theta = inverseFrequencies(128, 1e4);
    const ext = METHODS.longrope(CTX, { method: "longrope", longFactor, shortFactor });
    const same = METHODS.longrope(
      { ...CTX, targetContext: CTX.trainedContext },
      { method: "longrope", longFactor, shortFactor },
    );
    theta.forEach((t, i) => {
      expect(ext.invFreq[i]).toBe(t / longFactor[i]);
      expect(same.invFreq[i]).toBe(t / shortFactor[i]);
    });
    expect(same.attentionFactor).toBe(1);
  });
});

describe("NTK-aware base change (Peng et al. 2023 §3.1, Eq. 16)", () => {
  it("b' = b·s^(d/(d−2)) divides the lowest-frequency pair by exactly s (identity: b'^(−(d−2)/d) = b^(−(d−2)/d)/s)", () => {
    for (const s of [2, 8, 16, 64]) {
      const theta = inverseFrequencies(128, 1e4);
      const out = METHODS.ntk({ ...CTX, targetContext: s * 4096 }, { method: "ntk" });
      expect(out.invFreq[63] / (theta[63] / s)).toBeCloseTo(1, 12);
      expect(out.effectiveBase).toBeCloseTo(1e4 * Math.pow(s, 128 / 126), 6);
      expect(out.invFreq[0]).toBe(1); // the highest-frequency pair is never changed
    }
  });
});
