import { describe, expect, it } from "vitest";
import { analyse, ENGINE_VERSION, METHODS } from "../../../server/engine";
import { supportedLengthNaive } from "../../../server/engine/base-bound";
import { inverseFrequencies } from "../../../server/engine/frequencies";
import { analysisResponseSchema, resolvedAnalysisRequestSchema, type MethodId } from "../../../shared/schemas/analysis";
import { samplesFor } from "./fixtures";

const model = { headDim: 128, ropeTheta: 10_000, trainedContext: 4096 };
const allMethods = Object.values(samplesFor(128));

describe("analyse()", () => {
  const request = resolvedAnalysisRequestSchema.parse({ model, targetContext: 32_768, methods: allMethods });
  const res = analyse(request);

  it("answers the published contract, for every method in the table", () => {
    expect(() => analysisResponseSchema.parse(res)).not.toThrow();
    expect(res.engineVersion).toBe(ENGINE_VERSION);
    expect(res.methods.map((m) => m.method)).toEqual(Object.keys(METHODS) as MethodId[]);
    expect(res.model).toMatchObject({ rotaryDim: 128, pairs: 64, partialRotaryFactor: 1 });
    for (const m of res.methods) expect(m.pairs).toHaveLength(64);
  });

  it("resolves every default: factor = L'/L, YaRN 32/1/truncate, llama3 1/4, dynamic length = target, bands 1/32", () => {
    const byId = Object.fromEntries(res.methods.map((m) => [m.method, m.params]));
    expect(byId.linear).toEqual({ method: "linear", factor: 8 });
    expect(byId.ntk).toEqual({ method: "ntk", factor: 8 });
    expect(byId.dynamic).toEqual({ method: "dynamic", factor: 8, sequenceLength: 32_768 });
    expect(byId.yarn).toMatchObject({ method: "yarn", factor: 8, betaFast: 32, betaSlow: 1, truncate: true });
    expect(byId.llama3).toEqual({ method: "llama3", factor: 8, lowFreqFactor: 1, highFreqFactor: 4 });
    expect(res.bands).toEqual({ alpha: 1, beta: 32 });
  });

  it("model-level figures: d_extra = 92 (Liu et al. 2023) and the base support of 10 000 ends at 1707 (Men et al. 2024)", () => {
    expect(res.criticalDimension).toBe(92);
    expect(res.baseSupport).toEqual({
      base: 10_000,
      supportedLength: 1707,
      checkedUpTo: 1707,
      complete: true,
      supportsTarget: false,
    });
    expect(res.extrapolationBound.base).toBe(10_000);
    expect(res.extrapolationBound.tuneContext).toBe(32_768);
  });

  it("summaries count the pair flags, and the base-changing methods carry a Liu et al. bound", () => {
    for (const m of res.methods) {
      expect(m.summary.unseenAnglesPairs).toBe(m.pairs.filter((p) => p.unseenAngles).length);
      expect(m.summary.compressedResolutionPairs).toBe(m.pairs.filter((p) => p.compressedResolution).length);
      expect(m.summary.exceedsTrainedWindowPairs).toBe(18);
      expect(m.extrapolationBound === null).toBe(m.effectiveBase === null);
    }
  });

  it("decay curves: R(0) = 32.5 everywhere, one curve per requested method keyed by its index", () => {
    expect(Object.keys(res.decay.byMethod)).toEqual(allMethods.map((_, i) => String(i)));
    expect(res.decay.positions.at(-1)).toBe(32_768);
    expect(res.decay.original[0]).toBe(32.5);
    const at1000 = res.decay.positions.indexOf(1000);
    expect(res.decay.original[at1000]).toBeCloseTo(4.471, 3); // RoFormer §3.4.3, derived in docs/rotary-scaling.md
    for (const curve of Object.values(res.decay.byMethod)) {
      expect(curve).toHaveLength(res.decay.positions.length);
      expect(curve[0]).toBe(32.5);
    }
  });

  it("keeps Float64 values unrounded: the pair table carries the exact θ_i", () => {
    const theta = inverseFrequencies(128, 10_000);
    res.methods[0].pairs.forEach((p, i) => expect(p.invFreq).toBe(theta[i]));
  });

  it("a partial rotary factor halves the pairs (d = headDim × partialRotaryFactor)", () => {
    const r = analyse({
      model: { ...model, partialRotaryFactor: 0.5 },
      targetContext: 8192,
      methods: [{ method: "linear" }],
    });
    expect(r.model.rotaryDim).toBe(64);
    expect(r.methods[0].pairs).toHaveLength(32);
  });

  it("the in-request base scan stops at its budget for huge bases and says so; what it reports is true", () => {
    const r = analyse({
      model: { headDim: 256, ropeTheta: 1e9, trainedContext: 8192 },
      targetContext: 2 ** 31,
      methods: [{ method: "default" }],
    });
    expect(r.baseSupport.complete).toBe(false);
    expect(r.baseSupport.supportsTarget).toBeNull();
    expect(r.baseSupport.checkedUpTo).toBeGreaterThan(1000);
    expect(supportedLengthNaive(inverseFrequencies(256, 1e9), Math.min(r.baseSupport.checkedUpTo, 200_000))).toBeNull();
  });
});
