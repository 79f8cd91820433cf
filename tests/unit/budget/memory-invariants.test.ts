import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  cheapestFit,
  kvCacheBytesPerSequence,
  trainingMemoryPerAccelerator,
  type ModelShape,
} from "../../../server/engine/budget";
import { expectRelative } from "./fixtures";

// Identities of the memory model (issue: invariants), for any shape; none re-asserts a printed figure.

const shapeArb: fc.Arbitrary<ModelShape> = fc
  .record({
    parameters: fc.integer({ min: 1e6, max: 1e12 }),
    layers: fc.integer({ min: 1, max: 128 }),
    kvHeads: fc.integer({ min: 1, max: 16 }),
    group: fc.integer({ min: 1, max: 8 }),
    headDim: fc.constantFrom(64, 128, 256),
    vocabSize: fc.integer({ min: 1000, max: 300_000 }),
  })
  .map(({ group, ...rest }) => ({ ...rest, attentionHeads: rest.kvHeads * group }));

const settingsArb = fc.record({
  accelerators: fc.integer({ min: 1, max: 4096 }),
  flashAttention: fc.boolean(),
  microBatchSequences: fc.integer({ min: 1, max: 8 }),
  lossChunks: fc.integer({ min: 1, max: 64 }),
});

describe("memory invariants", () => {
  it("full ≤ selective ≤ none in activation checkpoints (Korthikanti et al. 2022, Table 2: 2 ≤ 34 ≤ 34 + 5as/h)", () => {
    fc.assert(
      fc.property(shapeArb, settingsArb, fc.integer({ min: 1, max: 2 ** 20 }), (model, settings, length) => {
        const at = (activationCheckpointing: "none" | "selective" | "full") =>
          trainingMemoryPerAccelerator({ model, sequenceLength: length, ...settings, activationCheckpointing })
            .activationCheckpoints;
        expect(at("full")).toBeLessThanOrEqual(at("selective"));
        expect(at("selective")).toBeLessThanOrEqual(at("none"));
      }),
    );
  });

  it("with flash attention and at least two layers, the order holds for checkpoints + recompute workspace too", () => {
    fc.assert(
      fc.property(shapeArb, settingsArb, fc.integer({ min: 1, max: 2 ** 20 }), (model, settings, length) => {
        fc.pre(model.layers >= 2);
        const at = (activationCheckpointing: "none" | "selective" | "full") => {
          const m = trainingMemoryPerAccelerator({
            model,
            sequenceLength: length,
            ...settings,
            flashAttention: true,
            activationCheckpointing,
          });
          return m.activationCheckpoints + m.recomputeWorkspace;
        };
        expect(at("full")).toBeLessThanOrEqual(at("selective"));
        expect(at("selective")).toBeLessThanOrEqual(at("none"));
      }),
    );
  });

  it("doubling contextParallel halves per-sequence activations (all modes, flash on) and logits", () => {
    fc.assert(
      fc.property(
        shapeArb,
        settingsArb,
        fc.integer({ min: 1, max: 2 ** 12 }),
        fc.constantFrom(1, 2, 4, 8),
        fc.constantFrom("none" as const, "selective" as const, "full" as const),
        (model, settings, chunksOf4, cp, activationCheckpointing) => {
          const sequenceLength = chunksOf4 * 4 * cp; // divisible by 2 × 2cp
          const at = (contextParallel: number) =>
            trainingMemoryPerAccelerator({
              model,
              sequenceLength,
              ...settings,
              flashAttention: true,
              activationCheckpointing,
              contextParallel,
            });
          const one = at(cp);
          const two = at(2 * cp);
          expectRelative(two.activationCheckpoints, one.activationCheckpoints / 2);
          expectRelative(two.recomputeWorkspace, one.recomputeWorkspace / 2);
          expectRelative(two.logits, one.logits / 2);
        },
      ),
    );
  });

  it("latent-attention KV is independent of the head counts", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 128 }),
        fc.integer({ min: 1, max: 4096 }),
        fc.integer({ min: 1, max: 256 }),
        fc.integer({ min: 1, max: 256 }),
        fc.integer({ min: 1, max: 2 ** 20 }),
        (layers, kvLatentDim, headsA, headsB, tokens) => {
          const shape = (kvHeads: number) => ({ layers, kvHeads, headDim: 128, kvLatentDim });
          expect(kvCacheBytesPerSequence(shape(headsA), tokens)).toBe(kvCacheBytesPerSequence(shape(headsB), tokens));
          expect(kvCacheBytesPerSequence(shape(headsA), tokens)).toBe(kvLatentDim * layers * 2 * tokens);
        },
      ),
    );
  });

  it("a fit change really fits and never weakens the checkpointing or lowers a setting", () => {
    fc.assert(
      fc.property(
        shapeArb,
        settingsArb,
        fc.integer({ min: 1, max: 2 ** 18 }),
        fc.integer({ min: 1e9, max: 2e11 }),
        (model, settings, length, memoryBytes) => {
          const input = {
            model,
            sequenceLength: length,
            ...settings,
            activationCheckpointing: "none" as const,
            contextParallel: 1,
            optimizerBytesPerParameter: 16,
          };
          const change = cheapestFit(input, memoryBytes);
          if (!change) return;
          expect(change.total).toBeLessThanOrEqual(memoryBytes);
          expect(change.lossChunks).toBeGreaterThanOrEqual(settings.lossChunks);
          const again = trainingMemoryPerAccelerator({ ...input, ...change });
          expect(again.total).toBe(change.total);
        },
      ),
      { numRuns: 50 },
    );
  });
});
