import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  attentionFlopsPerToken,
  estimateBudget,
  flopsPerToken,
  servingSequencesPerAccelerator,
  trainingMemoryPerAccelerator,
  type ModelShape,
  type ResolvedBudgetInput,
} from "../../../server/engine/budget";
import { expectRelative } from "./fixtures";

// Identities that must hold for any shape; none depends on a figure the code printed.

const shapeArb: fc.Arbitrary<ModelShape> = fc
  .record({
    parameters: fc.integer({ min: 1e6, max: 1e12 }),
    layers: fc.integer({ min: 1, max: 128 }),
    kvHeads: fc.integer({ min: 1, max: 16 }),
    group: fc.integer({ min: 1, max: 8 }),
    headDim: fc.constantFrom(32, 64, 80, 128, 256),
  })
  .map(({ group, ...rest }) => ({ ...rest, attentionHeads: rest.kvHeads * group }));

const clusterArb = fc.record({
  peakFlops: fc.double({ min: 1e12, max: 1e16, noNaN: true }),
  memoryBytes: fc.integer({ min: 1e9, max: 2e11 }),
  pricePerHour: fc.double({ min: 0.01, max: 100, noNaN: true }),
});

const lengthArb = fc.integer({ min: 1, max: 2 ** 20 });

const planArb = fc.record({
  model: shapeArb,
  cluster: clusterArb,
  accelerators: fc.integer({ min: 1, max: 4096 }),
  utilization: fc.double({ min: 0.01, max: 1, noNaN: true }),
  convention: fc.constantFrom("causal" as const, "full" as const),
  activationCheckpointing: fc.constantFrom("none" as const, "selective" as const, "full" as const),
  stage: fc.record({
    sequenceLength: lengthArb,
    steps: fc.integer({ min: 1, max: 1e5 }),
    globalBatch: fc.integer({ min: 1, max: 1024 }),
  }),
});

type PlanSample = typeof planArb extends fc.Arbitrary<infer T> ? T : never;
const toInput = ({ stage, ...rest }: PlanSample): ResolvedBudgetInput => ({ ...rest, stages: [stage] });

describe("budget invariants", () => {
  it("doubling steps doubles tokens, FLOPs, hours and cost exactly (×2 is exact in binary floating point)", () => {
    fc.assert(
      fc.property(planArb, (p) => {
        const once = estimateBudget(toInput(p)).stages[0];
        const twice = estimateBudget(toInput({ ...p, stage: { ...p.stage, steps: 2 * p.stage.steps } })).stages[0];
        expect(twice.tokens).toBe(2 * once.tokens);
        expect(twice.flops).toBe(2 * once.flops);
        expect(twice.acceleratorHours).toBe(2 * once.acceleratorHours);
        expect(twice.wallClockHours).toBe(2 * once.wallClockHours);
        expect(twice.cost).toBe(2 * once.cost);
      }),
    );
  });

  it("the causal attention term is exactly half the full one (6 vs 12 · n_layer · n_heads · head_dim · n_ctx)", () => {
    fc.assert(
      fc.property(shapeArb, lengthArb, (model, length) => {
        expect(2 * attentionFlopsPerToken(model, length, "causal")).toBe(attentionFlopsPerToken(model, length, "full"));
      }),
    );
  });

  it("full checkpointing costs exactly one extra forward pass: × 4/3 of the plain figure", () => {
    fc.assert(
      fc.property(shapeArb, lengthArb, (model, length) => {
        expectRelative(
          flopsPerToken(model, length, { activationCheckpointing: "full" }),
          (4 / 3) * flopsPerToken(model, length, { activationCheckpointing: "none" }),
        );
      }),
    );
  });

  it("at fixed tokens, a longer sequence costs strictly more (twice the length, half the steps)", () => {
    fc.assert(
      fc.property(planArb, (p) => {
        const short = estimateBudget(toInput({ ...p, stage: { ...p.stage, steps: 2 * p.stage.steps } })).stages[0];
        const long = estimateBudget(
          toInput({ ...p, stage: { ...p.stage, sequenceLength: 2 * p.stage.sequenceLength } }),
        ).stages[0];
        expect(long.tokens).toBe(short.tokens);
        expect(long.cost).toBeGreaterThan(short.cost);
        expect(long.flopsPerToken).toBeGreaterThan(short.flopsPerToken);
      }),
    );
  });

  it("growth: lengths rise from the trained length to 4 × target; cost per billion tokens and attention share rise", () => {
    fc.assert(
      fc.property(
        planArb,
        fc.integer({ min: 1, max: 2 ** 16 }),
        fc.integer({ min: 1, max: 64 }),
        (p, trained, reach) => {
          const input = { ...toInput(p), trainedContext: trained, targetContext: trained * reach, growthPoints: 12 };
          const growth = estimateBudget(input).growth;
          expect(growth[0].sequenceLength).toBe(trained);
          expect(growth.at(-1)?.sequenceLength).toBe(4 * trained * reach);
          for (let k = 1; k < growth.length; k++) {
            expect(growth[k].sequenceLength).toBeGreaterThan(growth[k - 1].sequenceLength);
            expect(growth[k].costPerBillionTokens).toBeGreaterThan(growth[k - 1].costPerBillionTokens);
            expect(growth[k].attentionShare).toBeGreaterThan(growth[k - 1].attentionShare);
          }
        },
      ),
    );
  });

  it("memory fit is monotone: what fits at a length fits at any shorter one", () => {
    fc.assert(
      fc.property(
        shapeArb,
        clusterArb,
        fc.integer({ min: 1, max: 512 }),
        lengthArb,
        lengthArb,
        (model, cluster, accelerators, a, b) => {
          const [shorter, longer] = a <= b ? [a, b] : [b, a];
          const memory = (sequenceLength: number) =>
            trainingMemoryPerAccelerator({ model, sequenceLength, accelerators }).total;
          if (memory(longer) <= cluster.memoryBytes) expect(memory(shorter)).toBeLessThanOrEqual(cluster.memoryBytes);
        },
      ),
    );
  });

  it("serving sequences per accelerator never rise with length", () => {
    fc.assert(
      fc.property(shapeArb, clusterArb, lengthArb, lengthArb, (model, cluster, a, b) => {
        const [shorter, longer] = a <= b ? [a, b] : [b, a];
        expect(servingSequencesPerAccelerator(model, longer, cluster.memoryBytes)).toBeLessThanOrEqual(
          servingSequencesPerAccelerator(model, shorter, cluster.memoryBytes),
        );
      }),
    );
  });

  it("totals are the sums of the stages and the last cumulative count is the total", () => {
    fc.assert(
      fc.property(
        planArb,
        fc.array(
          planArb.map((p) => p.stage),
          { minLength: 1, maxLength: 6 },
        ),
        (p, stages) => {
          const estimate = estimateBudget({ ...toInput(p), stages });
          const sum = (key: "tokens" | "flops" | "acceleratorHours" | "cost") =>
            estimate.stages.reduce((t, s) => t + s[key], 0);
          expect(estimate.totals.tokens).toBe(sum("tokens"));
          expect(estimate.stages.at(-1)?.cumulativeTokens).toBe(estimate.totals.tokens);
          expectRelative(estimate.totals.flops, sum("flops"));
          expectRelative(estimate.totals.cost, sum("cost"));
        },
      ),
    );
  });
});
