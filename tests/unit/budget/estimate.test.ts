import { describe, expect, it } from "vitest";
import { BUDGET_DEFAULTS, estimateBudget, logSpacedLengths } from "../../../server/engine/budget";
import { expectRelative, plan, SHAPE_7B, YARN_STAGE } from "./fixtures";

describe("estimateBudget on the YaRN stage (figures worked by hand in flops.test.ts and memory.test.ts)", () => {
  const estimate = estimateBudget(plan());
  const [stage] = estimate.stages;

  it("stage figures", () => {
    expect(stage.tokens).toBe(1_677_721_600);
    expect(stage.steps).toBe(400);
    expect(stage.tokenTarget).toBeNull();
    expect(stage.flopsPerToken).toBe(93_539_607_552);
    expect(stage.attentionFlopsPerToken).toBe(51_539_607_552);
    expectRelative(stage.acceleratorHours, 108.98154169827328);
    expectRelative(stage.wallClockHours, 1.70283658903552);
    expectRelative(stage.cost, 217.96308339654655);
    expect(stage.kvCacheBytesPerToken).toBe(524_288);
    expect(stage.kvCacheBytesPerSequence).toBe(34_359_738_368);
    expect(stage.servingSequencesPerAccelerator).toBe(1);
    expect(stage.trainingMemoryPerAccelerator).toBe(18_929_869_184);
    expect(stage.fits).toBe(true);
    expect(stage.minSequenceSharding).toBe(1);
    expect(stage.warnings).toEqual([]);
  });

  it("assumptions report the defaults used and say utilisation is an assumption", () => {
    const { assumptions } = estimate;
    expect(assumptions.convention).toBe("causal");
    expect(assumptions.conventionSource).toMatch(/Kaplan et al\. 2020/);
    expect(assumptions.utilization).toBe(0.4);
    expect(assumptions.utilizationSource).toMatch(/assum.*common practice, no source/);
    expect(assumptions.optimizerBytesPerParameter).toBe(16);
    expect(assumptions.defaulted).toEqual(
      expect.arrayContaining([
        "utilization",
        "convention",
        "recomputeFraction",
        "model.bytesPerElement",
        "model.hiddenSize",
      ]),
    );
    expect(assumptions.hiddenSize).toBe(4096);
    expect(assumptions.memoryModel.length).toBeGreaterThan(0);
  });

  it("given options are not reported as defaulted", () => {
    const given = estimateBudget(plan({ utilization: 0.5, convention: "full" })).assumptions;
    expect(given.defaulted).not.toContain("utilization");
    expect(given.utilizationSource).toBe("given with the request");
    expect(given.conventionSource).toMatch(/Chowdhery et al\. 2022/);
  });

  // 65 536 × 4^(k/8), rounded: 65 536 … 262 144, 9 points (default)
  it("growth runs from the trained length to 4 × the target, both ends included", () => {
    expect(estimate.growth.map((g) => g.sequenceLength)).toEqual([
      65_536, 77_936, 92_682, 110_218, 131_072, 155_872, 185_364, 220_436, 262_144,
    ]);
    expect(estimate.growth).toHaveLength(BUDGET_DEFAULTS.growthPoints);
  });

  // 1e9 tokens × 93 539 607 552 / 1.44e18 = 64.958 h → 129.916 at 2/h;
  // at 262 144: 42e9 + 4 × 51 539 607 552 = 248 158 430 208 → 172.332 h → 344.664
  it("growth cost per billion tokens at both ends, by hand", () => {
    expectRelative(estimate.growth[0].costPerBillionTokens, 129.9161216);
    expectRelative(estimate.growth[8].costPerBillionTokens, 344.6644864);
    expectRelative(estimate.growth[0].attentionShare, 51_539_607_552 / 93_539_607_552);
  });
});

describe("multi-stage plans", () => {
  const first = { sequenceLength: 4096, steps: 1000, globalBatch: 64 };
  const estimate = estimateBudget(plan({ stages: [first, YARN_STAGE] }));

  it("cumulative tokens and totals add the stages", () => {
    // 1000 × 64 × 4096 = 262 144 000; + 1 677 721 600 = 1 939 865 600
    expect(estimate.stages.map((s) => s.cumulativeTokens)).toEqual([262_144_000, 1_939_865_600]);
    expect(estimate.totals.tokens).toBe(1_939_865_600);
    for (const key of ["flops", "acceleratorHours", "wallClockHours", "cost"] as const) {
      expectRelative(estimate.totals[key], estimate.stages[0][key] + estimate.stages[1][key]);
    }
  });

  it("growth defaults to the shortest and longest stage: 4096 … 4 × 65 536", () => {
    expect(estimate.assumptions.trainedContext).toBe(4096);
    expect(estimate.assumptions.targetContext).toBe(65_536);
    expect(estimate.growth[0].sequenceLength).toBe(4096);
    expect(estimate.growth.at(-1)?.sequenceLength).toBe(262_144);
  });

  it("a token-target stage reports the target and the tokens its whole steps train", () => {
    const byTokens = estimateBudget(plan({ stages: [{ sequenceLength: 65_536, globalBatch: 64, tokens: 1e9 }] }));
    expect(byTokens.stages[0]).toMatchObject({ steps: 239, tokenTarget: 1e9, tokens: 1_002_438_656 });
    expect(byTokens.stages[0].flops).toBe(1_002_438_656 * 93_539_607_552);
  });
});

describe("warnings", () => {
  it("a stage that does not fit says so and names the sharding that would", () => {
    const estimate = estimateBudget(plan({ stages: [{ sequenceLength: 524_288, steps: 10, globalBatch: 64 }] }));
    const [stage] = estimate.stages;
    expect(stage.fits).toBe(false);
    expect(stage.minSequenceSharding).toBe(2);
    expect(stage.warnings.join(" ")).toMatch(/sequence sharding of 2 fits/);
    expect(
      estimateBudget(plan({ sequenceSharding: 2, stages: [{ sequenceLength: 524_288, steps: 10, globalBatch: 64 }] }))
        .stages[0].fits,
    ).toBe(true);
  });

  it("weights larger than one accelerator: 0 serving sequences and a warning", () => {
    const big = { ...SHAPE_7B, parameters: 70e9 }; // 140e9 bytes of weights > 80e9
    const [stage] = estimateBudget(plan({ model: big })).stages;
    expect(stage.servingSequencesPerAccelerator).toBe(0);
    expect(stage.warnings.join(" ")).toMatch(/weights .* do not fit/);
  });

  it("throws on an empty plan (the schema rejects it first)", () => {
    expect(() => estimateBudget(plan({ stages: [] }))).toThrow(RangeError);
  });
});

describe("log-spaced lengths", () => {
  it("keeps both ends exact and drops duplicates after rounding", () => {
    expect(logSpacedLengths(1, 4, 9)).toEqual([1, 2, 3, 4]);
    expect(logSpacedLengths(1000, 8000, 4)).toEqual([1000, 2000, 4000, 8000]);
  });
});
