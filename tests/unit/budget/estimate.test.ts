import { describe, expect, it } from "vitest";
import { BUDGET_DEFAULTS, estimateBudget, logSpacedLengths } from "../../../server/engine/budget";
import { expectRelative, plan, SHAPE_7B, YARN_STAGE } from "./fixtures";

describe("estimateBudget on the YaRN stage (figures worked by hand in flops.test.ts and memory.test.ts)", () => {
  const estimate = estimateBudget(plan());
  const [stage] = estimate.stages;

  // Defaults: causal convention, full checkpointing (× 4/3), flash attention, no context parallelism.
  //   FLOPs per token 93 539 607 552 × 4/3 = 124 719 476 736; hours 108.98154… × 4/3 = 145.30872…;
  //   wall clock ÷ 64 = 2.27044…; cost × 2 = 290.61744…
  //   memory: 1.75e9 + 2 × 65 536 × 4096 × 32 (17 179 869 184) + 34 × 65 536 × 4096 (9 126 805 504) = 28 056 674 688
  it("stage figures", () => {
    expect(stage.tokens).toBe(1_677_721_600);
    expect(stage.steps).toBe(400);
    expect(stage.tokenTarget).toBeNull();
    expect(stage.flopsPerToken).toBe(124_719_476_736);
    expect(stage.attentionFlopsPerToken).toBe(51_539_607_552);
    expectRelative(stage.acceleratorHours, 145.30872226436438);
    expectRelative(stage.wallClockHours, 2.2704487853806934);
    expectRelative(stage.cost, 290.61744452872875);
    expect(stage.utilizationBasis).toBe("assumed");
    expect(stage.kvCacheBytesPerToken).toBe(524_288);
    expect(stage.kvCacheBytesPerSequence).toBe(34_359_738_368);
    expect(stage.servingSequencesPerAccelerator).toBe(1);
    expect(stage.trainingMemory).toEqual({
      modelStates: 1.75e9,
      activationCheckpoints: 17_179_869_184,
      recomputeWorkspace: 9_126_805_504,
      logits: 0,
      total: 28_056_674_688,
    });
    expect(stage.trainingMemoryPerAccelerator).toBe(28_056_674_688);
    expect(stage.fits).toBe(true);
    expect(stage.fitChange).toBeNull();
    expect(stage.warnings).toEqual(["the vocabulary size is not given, so the logits are not counted"]);
  });

  it("with a vocabulary the logits count and the warning goes: 65 536 × 32 000 × 4 = 8 388 608 000", () => {
    const [withVocab] = estimateBudget(plan({ model: { ...SHAPE_7B, vocabSize: 32_000 } })).stages;
    expect(withVocab.trainingMemory.logits).toBe(8_388_608_000);
    expect(withVocab.warnings).toEqual([]);
  });

  it("serving: 66e9 ÷ 524 288 = 125 885 tokens is the longest context (kv-cache.test.ts)", () => {
    expect(estimate.serving).toEqual({ weightBytes: 14e9, kvCacheBytesPerElement: 2, longestServableContext: 125_885 });
  });

  it("assumptions report the defaults used, each convention once, and say utilisation is an assumption", () => {
    const { assumptions } = estimate;
    expect(assumptions.convention).toBe("causal");
    expect(assumptions.conventionSource).toMatch(/Kaplan et al\. 2020/);
    expect(assumptions.utilization).toBe(0.4);
    expect(assumptions.utilizationBasis).toBe("assumed");
    expect(assumptions.utilizationSource).toMatch(/assum.*common practice, no source/);
    expect(assumptions.activationCheckpointing).toBe("full");
    expect(assumptions.defaulted).toEqual(
      expect.arrayContaining([
        "utilization",
        "convention",
        "activationCheckpointing",
        "flashAttention",
        "contextParallel",
        "lossChunks",
        "model.vocabSize",
        "model.bytesPerElement",
        "model.hiddenSize",
      ]),
    );
    expect(assumptions.hiddenSize).toBe(4096);
    const ids = assumptions.conventions.map((c) => c.id);
    expect(new Set(ids).size).toBe(ids.length);
    expect(assumptions.conventions.find((c) => c.id === "activations")?.source).toMatch(/Korthikanti et al\. 2022/);
    expect(assumptions.conventions.find((c) => c.id === "logits")?.basis).toBe("stated");
    expect(assumptions.conventions.find((c) => c.id === "kv-cache")?.basis).toBe("stated");
  });

  it("given options are not reported as defaulted", () => {
    const given = estimateBudget(plan({ utilization: 0.5, convention: "full" })).assumptions;
    expect(given.defaulted).not.toContain("utilization");
    expect(given.utilizationSource).toBe("assumed: given with the request");
    expect(given.conventionSource).toMatch(/Chowdhery et al\. 2022/);
  });

  // 65 536 × 4^(k/8), rounded: 65 536 … 262 144, 9 points (default)
  it("growth runs from the trained length to 4 × the target, both ends included", () => {
    expect(estimate.growth.map((g) => g.sequenceLength)).toEqual([
      65_536, 77_936, 92_682, 110_218, 131_072, 155_872, 185_364, 220_436, 262_144,
    ]);
    expect(estimate.growth).toHaveLength(BUDGET_DEFAULTS.growthPoints);
  });

  // 1e9 tokens × 93 539 607 552 / 1.44e18 = 64.958 h → 129.916 at 2/h, × 4/3 (full) = 173.2215;
  // at 262 144: 42e9 + 4 × 51 539 607 552 = 248 158 430 208 → 344.664 × 4/3 = 459.5526
  it("growth cost per billion tokens at both ends, by hand", () => {
    expectRelative(estimate.growth[0].costPerBillionTokens, 173.22149546666665);
    expectRelative(estimate.growth[8].costPerBillionTokens, 459.5526485333333);
    // the share of the plain training figure, before recompute
    expectRelative(estimate.growth[0].attentionShare, 51_539_607_552 / 93_539_607_552);
  });
});

describe("calibration from a measured throughput", () => {
  // 2000 tokens/s per accelerator at 65 536 tokens, 124 719 476 736 FLOPs per token (full), peak 1e15:
  //   utilisation = 2000 × 124 719 476 736 ÷ 1e15 = 0.249438953472
  //   hours at that length = tokens ÷ throughput = 1 677 721 600 ÷ (2000 × 3600) = 233.01688…
  it("derives utilisation from tokens/s and says every figure used it", () => {
    const measured = estimateBudget(plan({ measuredTokensPerSecond: 2000 }));
    expectRelative(measured.assumptions.utilization, 0.249438953472);
    expect(measured.assumptions.utilizationBasis).toBe("measured");
    expect(measured.assumptions.utilizationSource).toMatch(/measured 2000 tokens\/s per accelerator at 65536/);
    expect(measured.assumptions.defaulted).not.toContain("utilization");
    expect(measured.stages[0].utilizationBasis).toBe("measured");
    expectRelative(measured.stages[0].acceleratorHours, 233.0168888888889);
  });
});

describe("budget model 1 names, still accepted", () => {
  it("sequenceSharding is contextParallel; recomputeFraction 1 is full, 0 is none", () => {
    const old = estimateBudget(plan({ sequenceSharding: 2, recomputeFraction: 0 })).assumptions;
    expect(old.contextParallel).toBe(2);
    expect(old.activationCheckpointing).toBe("none");
    expect(estimateBudget(plan({ recomputeFraction: 1 })).assumptions.activationCheckpointing).toBe("full");
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
    expect(byTokens.stages[0].flops).toBe(1_002_438_656 * 124_719_476_736);
  });
});

describe("warnings", () => {
  it("a stage that does not fit names its largest term and the cheapest change (memory.test.ts: cp 4)", () => {
    const stages = [{ sequenceLength: 524_288, steps: 10, globalBatch: 64 }];
    const [stage] = estimateBudget(plan({ stages })).stages;
    expect(stage.fits).toBe(false);
    expect(stage.largestMemoryTerm).toBe("activationCheckpoints");
    expect(stage.fitChange).toMatchObject({ activationCheckpointing: "full", contextParallel: 4, lossChunks: 1 });
    expect(stage.warnings[0]).toMatch(
      /largest term is the activation checkpoints .*cheapest change that fits: context parallelism 4 \(/,
    );
    expect(estimateBudget(plan({ contextParallel: 4, stages })).stages[0].fits).toBe(true);
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
