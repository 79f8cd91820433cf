import { describe, expect, it } from "vitest";
import { analyse } from "../../server/engine";
import { expandAnalysis, packAnalysis } from "../../shared/analysis-columns";
import { METHOD_IDS, resolvedAnalysisRequestSchema } from "../../shared/schemas/analysis";
import { analysisColumnsResponseSchema } from "../../shared/schemas/analysis-columns";

// The column form is a lossless re-layout: unpacking it must give back the engine's row form exactly (an identity,
// checked on every method, several shapes and custom bands), and it must be much smaller.
const ramp = (n: number) => Array.from({ length: n }, (_, i) => 1 + i / 2);
const every = (pairs: number) =>
  METHOD_IDS.map((m) =>
    m === "longrope"
      ? { method: m, longFactor: ramp(pairs), shortFactor: ramp(pairs).map(() => 1) }
      : m === "base"
        ? { method: m, base: 5e7 }
        : { method: m },
  );
const cases = [
  { model: { headDim: 128, ropeTheta: 500_000, trainedContext: 8192 }, targetContext: 1_048_576, methods: every(64) },
  {
    model: { headDim: 96, partialRotaryFactor: 0.5, ropeTheta: 10_000, trainedContext: 2048 },
    targetContext: 16_384,
    bands: { alpha: 0.5, beta: 8 },
    methods: every(24),
  },
  {
    model: { headDim: 16, ropeTheta: 10_000, trainedContext: 4096 },
    targetContext: 8192,
    methods: [{ method: "ntk" }],
  },
];

describe("analysis column form", () => {
  it.each(cases.map((c, i) => [i, c] as const))(
    "case %i: expanding the packed answer gives the rows exactly",
    (_i, c) => {
      const full = analyse(resolvedAnalysisRequestSchema.parse(c));
      const packed = analysisColumnsResponseSchema.parse(JSON.parse(JSON.stringify(packAnalysis(full))));
      // through JSON, as the client receives it: float64 numbers survive JSON.stringify/parse unchanged (ECMA-262 Number::toString)
      expect(expandAnalysis(packed)).toEqual(JSON.parse(JSON.stringify(full)));
    },
  );

  it.each(cases.map((c, i) => [i, c] as const))(
    "case %i: the expanded answer serialises to the engine's JSON byte for byte (same fields in the same order)",
    (_i, c) => {
      const full = analyse(resolvedAnalysisRequestSchema.parse(c));
      const json = JSON.stringify(full);
      expect(JSON.stringify(expandAnalysis(packAnalysis(full)))).toBe(json);
      expect(JSON.stringify(expandAnalysis(JSON.parse(JSON.stringify(packAnalysis(full)))))).toBe(json);
    },
  );

  it("the original-frequency columns the column form sends once are the same in every method's rows", () => {
    const full = analyse(resolvedAnalysisRequestSchema.parse(cases[0]));
    const common = (m: (typeof full.methods)[number]) =>
      m.pairs.map((p) => [p.invFreq, p.wavelength, p.rotationsInTrainedWindow, p.band, p.exceedsTrainedWindow]);
    for (const m of full.methods) expect(common(m)).toEqual(common(full.methods[0]));
  });

  it("is under a third of the row form for 8 methods at d = 128", () => {
    const full = analyse(resolvedAnalysisRequestSchema.parse(cases[0]));
    const rows = JSON.stringify(full).length;
    const columns = JSON.stringify(packAnalysis(full)).length;
    expect(columns).toBeLessThan(rows / 3);
  });
});
