import { describe, expect, it } from "vitest";
import { budgetEstimateRequestSchema } from "../../../shared/schemas/budget";
import { planBudgetSchema } from "../../../shared/schemas";

const valid = {
  model: { parameters: 8e9, layers: 32, attentionHeads: 32, kvHeads: 8, headDim: 128, vocabSize: 128_256 },
  cluster: { peakFlops: 1e15, memoryBytes: 80e9, pricePerHour: 2 },
  accelerators: 64,
  stages: [{ sequenceLength: 131_072, steps: 100, globalBatch: 64 }],
};

function issues(body: unknown): Record<string, string> {
  const result = budgetEstimateRequestSchema.safeParse(body);
  expect(result.success).toBe(false);
  if (result.success) return {};
  return Object.fromEntries(result.error.issues.map((i) => [i.path.join("."), i.message]));
}

describe("budget model 2 settings", () => {
  it("accepts every new setting and the model's new fields", () => {
    const body = {
      ...valid,
      model: {
        ...valid.model,
        kvLatentDim: null,
        layerGroups: [
          { kind: "full_attention", layers: 8, slidingWindow: null },
          { kind: "sliding_attention", layers: 24, slidingWindow: 4096 },
        ],
      },
      activationCheckpointing: "selective",
      flashAttention: false,
      contextParallel: 4,
      lossChunks: 8,
      kvCacheBytesPerElement: 1,
      measuredTokensPerSecond: 3000,
      measuredSequenceLength: 8192,
    };
    expect(budgetEstimateRequestSchema.safeParse(body).success).toBe(true);
  });

  it("a stored profile by id may add what the profile lacks, but not its shape", () => {
    const byId = { ...valid, model: { modelId: 3, vocabSize: 151_936, kvLatentDim: 576 } };
    expect(budgetEstimateRequestSchema.safeParse(byId).success).toBe(true);
    expect(issues({ ...valid, model: { modelId: 3, layers: 4 } })).toHaveProperty("model.layers");
  });

  it("layer groups must cover the model's layers", () => {
    const groups = [{ kind: "full_attention", layers: 30 }];
    expect(issues({ ...valid, model: { ...valid.model, layerGroups: groups } })["model.layerGroups"]).toMatch(
      /sum to 30, the model has 32/,
    );
  });

  it("the sequence must divide by 2 × contextParallel, and the message says why", () => {
    // 131 072 ÷ 8 = 16 384 chunks: fine for degree 4; 100 004 is not a multiple of 8 (100 004 = 8 × 12 500 + 4)
    expect(budgetEstimateRequestSchema.safeParse({ ...valid, contextParallel: 4 }).success).toBe(true);
    const bad = issues({ ...valid, contextParallel: 4, stages: [{ ...valid.stages[0], sequenceLength: 100_004 }] });
    expect(bad.contextParallel).toMatch(/100004 tokens do not divide by 2 × 4 = 8: .*one early and one late chunk/);
    // degree 1 splits nothing: an odd length is fine
    expect(
      budgetEstimateRequestSchema.safeParse({ ...valid, stages: [{ ...valid.stages[0], sequenceLength: 99_999 }] })
        .success,
    ).toBe(true);
    expect(issues({ ...valid, contextParallel: 128 }).contextParallel).toMatch(/cannot exceed accelerators/);
  });

  it("budget model 1 names: accepted alone, refused beside their replacements, fractions refused", () => {
    expect(budgetEstimateRequestSchema.safeParse({ ...valid, sequenceSharding: 2, recomputeFraction: 1 }).success).toBe(
      true,
    );
    expect(issues({ ...valid, sequenceSharding: 2, contextParallel: 2 })).toHaveProperty("sequenceSharding");
    expect(issues({ ...valid, recomputeFraction: 1, activationCheckpointing: "full" })).toHaveProperty(
      "recomputeFraction",
    );
    expect(issues({ ...valid, recomputeFraction: 0.5 }).recomputeFraction).toMatch(/only 0 \(none\) or 1 \(full\)/);
  });

  it("enumerations and ranges name their field", () => {
    expect(issues({ ...valid, activationCheckpointing: "some" })).toHaveProperty("activationCheckpointing");
    expect(issues({ ...valid, flashAttention: "yes" })).toHaveProperty("flashAttention");
    expect(issues({ ...valid, lossChunks: 0 })).toHaveProperty("lossChunks");
    expect(issues({ ...valid, kvCacheBytesPerElement: 0.01 })).toHaveProperty("kvCacheBytesPerElement");
    expect(issues({ ...valid, measuredTokensPerSecond: -1 })).toHaveProperty("measuredTokensPerSecond");
  });

  it("a plan's budget sheet takes the same settings and a vocabulary size", () => {
    const sheet = {
      cluster: { acceleratorId: 1 },
      accelerators: 8,
      contextParallel: 2,
      lossChunks: 4,
      vocabSize: 32_000,
    };
    expect(planBudgetSchema.safeParse(sheet).success).toBe(true);
    expect(planBudgetSchema.safeParse({ ...sheet, sequenceSharding: 2 }).success).toBe(false);
  });
});
