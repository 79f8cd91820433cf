import { describe, expect, it } from "vitest";
import {
  dataParallelRanks,
  kvCacheBytesPerSequence,
  kvCacheBytesPerToken,
  minSequenceSharding,
  servingSequencesPerAccelerator,
  shardingDegrees,
  trainingMemoryPerAccelerator,
} from "../../../server/engine/budget";
import { SHAPE_7B } from "./fixtures";

describe("KV cache", () => {
  // docs/budget-conventions.md (derived): 2 · 32 layers · 32 KV heads · 128 · 2 bytes = 524 288
  it("524 288 bytes per token for 32 layers × 32 KV heads × 128 × 2 bytes", () => {
    expect(kvCacheBytesPerToken({ layers: 32, kvHeads: 32, headDim: 128, bytesPerElement: 2 })).toBe(524_288);
    expect(kvCacheBytesPerToken({ layers: 32, kvHeads: 32, headDim: 128 })).toBe(524_288); // 2 bytes by default
  });

  it("grouped-query attention counts KV heads, not query heads: 8 KV heads → a quarter", () => {
    expect(kvCacheBytesPerToken({ ...SHAPE_7B, kvHeads: 8 })).toBe(131_072);
  });

  it("per sequence: 524 288 × 65 536 = 34 359 738 368 bytes = 32 GiB (derived)", () => {
    expect(kvCacheBytesPerSequence(SHAPE_7B, 65_536)).toBe(32 * 2 ** 30);
  });

  // weights 7e9 × 2 = 14e9 bytes; free on 80e9 = 66e9
  //   at 65 536: 66e9 / 34 359 738 368 = 1.92 → 1;  at 4096: 66e9 / 2 147 483 648 = 30.7 → 30
  it("serving sequences per accelerator beside one copy of the weights", () => {
    expect(servingSequencesPerAccelerator(SHAPE_7B, 65_536, 80e9)).toBe(1);
    expect(servingSequencesPerAccelerator(SHAPE_7B, 4096, 80e9)).toBe(30);
  });

  it("0 when the weights alone do not fit (14e9 bytes of weights on 14e9 and 10e9 bytes)", () => {
    expect(servingSequencesPerAccelerator(SHAPE_7B, 4096, 14e9)).toBe(0);
    expect(servingSequencesPerAccelerator(SHAPE_7B, 4096, 10e9)).toBe(0);
  });
});

describe("training memory per accelerator (stated simple model, common practice, no source)", () => {
  // model states 7e9 × 16 / 64 ranks = 1.75e9; activations 32 × 65 536 × 4096 × 2 = 17 179 869 184
  it("64 accelerators, 65 536 tokens, no sequence sharding: 18 929 869 184 bytes", () => {
    const memory = trainingMemoryPerAccelerator({ model: SHAPE_7B, sequenceLength: 65_536, accelerators: 64 });
    expect(memory).toEqual({ modelStates: 1.75e9, activations: 17_179_869_184, total: 18_929_869_184 });
  });

  // 524 288 tokens, 64 accelerators:
  //   degree 1: 1.75e9 + 137 438 953 472 = 139.2e9 > 80e9
  //   degree 2: 7e9 × 16 / 32 = 3.5e9, 137 438 953 472 / 2 = 68 719 476 736 → 72 219 476 736 ≤ 80e9
  it("the smallest power-of-two sequence sharding that fits 524 288 tokens on 64 accelerators is 2", () => {
    const input = { model: SHAPE_7B, sequenceLength: 524_288, accelerators: 64 };
    expect(trainingMemoryPerAccelerator({ ...input, sequenceSharding: 2 }).total).toBe(72_219_476_736);
    expect(minSequenceSharding(input, 80e9)).toBe(2);
  });

  // 8 accelerators at 524 288: 14e9 + 137.4e9; 28e9 + 68.7e9; 56e9 + 34.4e9; 112e9 + 17.2e9 — none ≤ 80e9
  it("null when no degree up to the accelerator count fits", () => {
    expect(minSequenceSharding({ model: SHAPE_7B, sequenceLength: 524_288, accelerators: 8 }, 80e9)).toBeNull();
  });

  it("a micro-batch of 2 sequences doubles activations; 4-byte elements double them again", () => {
    const one = trainingMemoryPerAccelerator({ model: SHAPE_7B, sequenceLength: 4096, accelerators: 8 });
    const two = trainingMemoryPerAccelerator({
      model: SHAPE_7B,
      sequenceLength: 4096,
      accelerators: 8,
      microBatchSequences: 2,
    });
    const wide = trainingMemoryPerAccelerator({
      model: { ...SHAPE_7B, bytesPerElement: 4 },
      sequenceLength: 4096,
      accelerators: 8,
      microBatchSequences: 2,
    });
    expect(two.activations).toBe(2 * one.activations);
    expect(wide.activations).toBe(2 * two.activations);
    expect(two.modelStates).toBe(one.modelStates);
  });

  it("hiddenSize, when given, replaces heads × headDim in the activation term", () => {
    const memory = trainingMemoryPerAccelerator({
      model: { ...SHAPE_7B, hiddenSize: 8192 },
      sequenceLength: 4096,
      accelerators: 1,
    });
    expect(memory.activations).toBe(32 * 4096 * 8192 * 2);
  });

  it("degrees are the powers of two up to the accelerator count; ranks are whole groups", () => {
    expect(shardingDegrees(1)).toEqual([1]);
    expect(shardingDegrees(24)).toEqual([1, 2, 4, 8, 16]);
    expect(dataParallelRanks(24, 16)).toBe(1);
    expect(dataParallelRanks(64, 4)).toBe(16);
  });
});
