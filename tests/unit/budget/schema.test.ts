import { describe, expect, it } from "vitest";
import {
  acceleratorInputSchema,
  acceleratorSchema,
  acceleratorUpdateSchema,
  budgetEstimateRequestSchema,
  MAX_BUDGET_STAGES,
} from "../../../shared/schemas/budget";

const valid = {
  model: { parameters: 7e9, layers: 32, attentionHeads: 32, kvHeads: 8, headDim: 128 },
  cluster: { peakFlops: 1e15, memoryBytes: 80e9, pricePerHour: 2 },
  accelerators: 64,
  utilization: 0.4,
  stages: [{ sequenceLength: 65_536, steps: 400, globalBatch: 64 }],
};

/** The dotted paths of every issue, as the router names fields. */
function rejectedPaths(body: unknown): string[] {
  const result = budgetEstimateRequestSchema.safeParse(body);
  expect(result.success).toBe(false);
  return result.success ? [] : result.error.issues.map((issue) => issue.path.join("."));
}

const withModel = (patch: object) => ({ ...valid, model: { ...valid.model, ...patch } });
const withStage = (patch: object) => ({ ...valid, stages: [{ ...valid.stages[0], ...patch }] });

describe("budget request: accepted forms", () => {
  it("a shape, steps stage, explicit cluster", () => {
    expect(budgetEstimateRequestSchema.safeParse(valid).success).toBe(true);
  });

  it("a modelId, an acceleratorId, a token-target stage, no optional fields", () => {
    const body = {
      model: { modelId: 3 },
      cluster: { acceleratorId: 1 },
      accelerators: 8,
      stages: [{ sequenceLength: 32_768, tokens: 400e9, globalBatch: 128 }],
    };
    expect(budgetEstimateRequestSchema.safeParse(body).success).toBe(true);
  });

  it("utilisation of exactly 1 is allowed (the interval is (0, 1])", () => {
    expect(budgetEstimateRequestSchema.safeParse({ ...valid, utilization: 1 }).success).toBe(true);
  });

  it(`${MAX_BUDGET_STAGES} stages are allowed`, () => {
    expect(
      budgetEstimateRequestSchema.safeParse({ ...valid, stages: Array(MAX_BUDGET_STAGES).fill(valid.stages[0]) })
        .success,
    ).toBe(true);
  });
});

describe("budget request: each bad input is rejected and the issue names the field", () => {
  it.each([
    ["model.parameters", withModel({ parameters: 0 })],
    ["model.layers", withModel({ layers: 0 })],
    ["model.attentionHeads", withModel({ attentionHeads: -32 })],
    ["model.kvHeads", withModel({ kvHeads: 0 })],
    ["model.headDim", withModel({ headDim: 0 })],
    ["model.layers", withModel({ layers: 2.5 })],
    ["model.hiddenSize", withModel({ hiddenSize: -1 })],
    ["model.bytesPerElement", withModel({ bytesPerElement: 0 })],
    ["model.kvHeads", withModel({ kvHeads: 5 })], // 32 heads cannot be split into 5 KV groups
    ["model.modelId", { ...valid, model: { modelId: 0 } }],
    ["cluster.peakFlops", { ...valid, cluster: { ...valid.cluster, peakFlops: 0 } }],
    ["cluster.memoryBytes", { ...valid, cluster: { ...valid.cluster, memoryBytes: -1 } }],
    ["cluster.pricePerHour", { ...valid, cluster: { ...valid.cluster, pricePerHour: -0.5 } }],
    ["cluster.acceleratorId", { ...valid, cluster: { acceleratorId: -1 } }],
    ["accelerators", { ...valid, accelerators: 0 }],
    ["accelerators", { ...valid, accelerators: 1.5 }],
    ["utilization", { ...valid, utilization: 0 }],
    ["utilization", { ...valid, utilization: -0.1 }],
    ["utilization", { ...valid, utilization: 1.01 }],
    ["recomputeFraction", { ...valid, recomputeFraction: 1.5 }],
    ["optimizerBytesPerParameter", { ...valid, optimizerBytesPerParameter: 0 }],
    ["convention", { ...valid, convention: "quadratic" }],
    ["sequenceSharding", { ...valid, sequenceSharding: 128 }], // more than the 64 accelerators
    ["trainedContext", { ...valid, trainedContext: 0 }],
    ["targetContext", { ...valid, targetContext: -4096 }],
    ["targetContext", { ...valid, trainedContext: 8192, targetContext: 4096 }],
    ["growthPoints", { ...valid, growthPoints: 1 }],
    ["stages", { ...valid, stages: [] }],
    ["stages", { ...valid, stages: Array(MAX_BUDGET_STAGES + 1).fill(valid.stages[0]) }],
    ["stages.0.sequenceLength", withStage({ sequenceLength: 0 })],
    ["stages.0.sequenceLength", withStage({ sequenceLength: 2 ** 28 })],
    ["stages.0.steps", withStage({ steps: 0 })],
    ["stages.0.globalBatch", withStage({ globalBatch: -64 })],
    ["stages.0.tokens", { ...valid, stages: [{ sequenceLength: 4096, globalBatch: 8, tokens: 0 }] }],
    ["stages.0.tokens", withStage({ tokens: 1e9 })], // steps and tokens together
    ["stages.0.steps", { ...valid, stages: [{ sequenceLength: 4096, globalBatch: 8 }] }], // neither
  ])("%s", (path, body) => {
    expect(rejectedPaths(body)).toContain(path);
  });

  it.each([NaN, Infinity, -Infinity])("%s is rejected wherever a number goes", (bad) => {
    expect(rejectedPaths({ ...valid, utilization: bad })).toContain("utilization");
    expect(rejectedPaths({ ...valid, accelerators: bad })).toContain("accelerators");
    expect(rejectedPaths(withStage({ steps: bad }))).toContain("stages.0.steps");
    expect(rejectedPaths(withStage({ sequenceLength: bad }))).toContain("stages.0.sequenceLength");
    expect(rejectedPaths({ ...valid, stages: [{ sequenceLength: 4096, globalBatch: 8, tokens: bad }] })).toContain(
      "stages.0.tokens",
    );
    expect(rejectedPaths({ ...valid, trainedContext: bad })).toContain("trainedContext");
    expect(rejectedPaths(withModel({ parameters: bad }))).toContain("model.parameters");
    expect(rejectedPaths({ ...valid, cluster: { ...valid.cluster, peakFlops: bad } })).toContain("cluster.peakFlops");
    expect(rejectedPaths({ ...valid, model: { modelId: bad } })).toContain("model.modelId");
  });

  it("null and strings where numbers go name the field", () => {
    expect(rejectedPaths(withModel({ headDim: null }))).toContain("model.headDim");
    expect(rejectedPaths({ ...valid, cluster: { acceleratorId: "h100" } })).toContain("cluster.acceleratorId");
  });

  it("a modelId mixed with shape fields is rejected rather than silently picking one", () => {
    expect(rejectedPaths({ ...valid, model: { ...valid.model, modelId: 3 } })).toContain("model.parameters");
    expect(rejectedPaths({ ...valid, cluster: { acceleratorId: 1, peakFlops: 1e15 } })).toContain("cluster.peakFlops");
  });

  it("without a modelId, every shape field is required and named", () => {
    const paths = rejectedPaths({ ...valid, model: { parameters: 7e9, layers: 32 } });
    expect(paths).toEqual(expect.arrayContaining(["model.attentionHeads", "model.kvHeads", "model.headDim"]));
    expect(rejectedPaths({ ...valid, cluster: {} })).toEqual(
      expect.arrayContaining(["cluster.peakFlops", "cluster.memoryBytes", "cluster.pricePerHour"]),
    );
  });

  it("a misspelled model field is rejected", () => {
    expect(rejectedPaths(withModel({ numLayers: 32 }))).toContain("model");
  });
});

describe("accelerator catalog", () => {
  const h = {
    name: "Round accelerator",
    memoryBytes: 80e9,
    peakFlops: 1e15,
    pricePerHour: 2,
    notes: "stated round figures",
  };

  it("accepts a record and an input; update is partial", () => {
    expect(acceleratorSchema.safeParse({ id: 1, ...h, retiredAt: null }).success).toBe(true);
    expect(acceleratorSchema.safeParse({ id: 1, ...h, retiredAt: "2026-12-01T10:00:00.000Z" }).success).toBe(true);
    expect(acceleratorInputSchema.safeParse(h).success).toBe(true);
    expect(acceleratorUpdateSchema.safeParse({ pricePerHour: 3 }).success).toBe(true);
  });

  it.each([
    ["name", { ...h, name: "  " }],
    ["memoryBytes", { ...h, memoryBytes: 0 }],
    ["peakFlops", { ...h, peakFlops: NaN }],
    ["peakFlops", { ...h, peakFlops: Infinity }],
    ["pricePerHour", { ...h, pricePerHour: -1 }],
  ])("rejects a bad %s", (path, body) => {
    const result = acceleratorInputSchema.safeParse(body);
    expect(result.success).toBe(false);
    expect(result.error?.issues.map((i) => i.path.join("."))).toContain(path);
  });
});
