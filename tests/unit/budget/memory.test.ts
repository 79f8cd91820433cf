import { describe, expect, it } from "vitest";
import {
  cheapestFit,
  dataParallelRanks,
  largestMemoryTerm,
  trainingMemoryPerAccelerator,
} from "../../../server/engine/budget";
import { SHAPE_7B } from "./fixtures";

// Training memory, checked against Korthikanti et al. 2022, "Reducing Activation Recomputation in Large Transformer
// Models", Table 2 (rows without tensor parallelism, t = 1; recalled from memory): per layer at 16-bit activations
// s·b·h·(34 + 5·a·s/h) with nothing recomputed, 34·s·b·h with selective recomputation, 2·s·b·h with full.
// SHAPE_7B: h = 4096, a = 32, l = 32. At s = 4096, b = 1:
//   s·b·h = 4096 × 4096 = 16 777 216;  34·s·b·h = 570 425 344;  5·a·s²·b = 5 × 32 × 4096² = 2 684 354 560
//   (5·a·s/h = 160, so s·b·h·(34 + 160) = 16 777 216 × 194 = 3 254 779 904 per layer, the same sum).
const at4k = { model: SHAPE_7B, sequenceLength: 4096, accelerators: 64 };

describe("activation checkpoints and recompute workspace (Korthikanti et al. 2022, Table 2)", () => {
  it("none, without flash attention: 3 254 779 904 × 32 layers = 104 152 956 928", () => {
    const m = trainingMemoryPerAccelerator({ ...at4k, activationCheckpointing: "none", flashAttention: false });
    expect(m.activationCheckpoints).toBe(104_152_956_928);
    expect(m.recomputeWorkspace).toBe(0);
  });

  it("none with flash attention drops the 5·a·s/h term: 570 425 344 × 32 = 18 253 611 008", () => {
    const m = trainingMemoryPerAccelerator({ ...at4k, activationCheckpointing: "none", flashAttention: true });
    expect(m.activationCheckpoints).toBe(18_253_611_008);
  });

  it("selective: 34·s·b·h·l = 18 253 611 008 with or without flash attention; no workspace", () => {
    for (const flashAttention of [true, false]) {
      const m = trainingMemoryPerAccelerator({ ...at4k, activationCheckpointing: "selective", flashAttention });
      expect(m.activationCheckpoints).toBe(18_253_611_008);
      expect(m.recomputeWorkspace).toBe(0);
    }
  });

  it("full: 2·s·b·h·l = 1 073 741 824 kept; one layer rebuilt: 570 425 344, or 3 254 779 904 without flash", () => {
    const flash = trainingMemoryPerAccelerator({ ...at4k, activationCheckpointing: "full", flashAttention: true });
    expect(flash.activationCheckpoints).toBe(1_073_741_824);
    expect(flash.recomputeWorkspace).toBe(570_425_344);
    const plain = trainingMemoryPerAccelerator({ ...at4k, activationCheckpointing: "full", flashAttention: false });
    expect(plain.activationCheckpoints).toBe(1_073_741_824);
    expect(plain.recomputeWorkspace).toBe(3_254_779_904);
  });

  it("context parallelism 2 gives each rank s = 2048: full checkpoints 2 × 2048 × 4096 × 32 = 536 870 912", () => {
    const m = trainingMemoryPerAccelerator({ ...at4k, contextParallel: 2, activationCheckpointing: "full" });
    expect(m.activationCheckpoints).toBe(536_870_912);
    // data-parallel ranks = floor(64 ÷ 2) = 32 → model states 7e9 × 16 ÷ 32 = 3.5e9
    expect(m.modelStates).toBe(3.5e9);
  });

  it("a micro-batch of 2 doubles the activations; 4-byte activations double them again (scaled by bytes ÷ 2)", () => {
    const one = trainingMemoryPerAccelerator({ ...at4k, activationCheckpointing: "selective" });
    const two = trainingMemoryPerAccelerator({ ...at4k, activationCheckpointing: "selective", microBatchSequences: 2 });
    const wide = trainingMemoryPerAccelerator({
      ...at4k,
      model: { ...SHAPE_7B, bytesPerElement: 4 },
      activationCheckpointing: "selective",
      microBatchSequences: 2,
    });
    expect(two.activationCheckpoints).toBe(2 * one.activationCheckpoints);
    expect(wide.activationCheckpoints).toBe(2 * two.activationCheckpoints);
  });
});

// Logits: a stated convention (docs/budget-conventions.md "Logits"): s·b·V fp32 values, 4 bytes each, ÷ lossChunks.
describe("logits (stated convention)", () => {
  it("the issue's figure: 131 072 tokens × a 128 000 vocabulary × 4 bytes = 67 108 864 000 bytes, about 67 GB", () => {
    const m = trainingMemoryPerAccelerator({
      model: { ...SHAPE_7B, vocabSize: 128_000 },
      sequenceLength: 131_072,
      accelerators: 1,
    });
    expect(m.logits).toBe(67_108_864_000);
  });

  it("4096 × 32 000 × 4 = 524 288 000; four loss chunks: 131 072 000; unknown vocabulary: not counted", () => {
    const model = { ...SHAPE_7B, vocabSize: 32_000 };
    expect(trainingMemoryPerAccelerator({ ...at4k, model }).logits).toBe(524_288_000);
    expect(trainingMemoryPerAccelerator({ ...at4k, model, lossChunks: 4 }).logits).toBe(131_072_000);
    expect(trainingMemoryPerAccelerator(at4k).logits).toBe(0);
  });
});

describe("model states and the total (common practice, no source)", () => {
  // 7e9 × 16 ÷ 64 = 1.75e9; full + flash + V = 32 000: 1.75e9 + 1 073 741 824 + 570 425 344 + 524 288 000
  it("total = model states + checkpoints + workspace + logits = 3 918 455 168", () => {
    const m = trainingMemoryPerAccelerator({ ...at4k, model: { ...SHAPE_7B, vocabSize: 32_000 } });
    expect(m).toEqual({
      modelStates: 1.75e9,
      activationCheckpoints: 1_073_741_824,
      recomputeWorkspace: 570_425_344,
      logits: 524_288_000,
      total: 3_918_455_168,
    });
    expect(largestMemoryTerm(m)).toBe("modelStates");
  });

  it("data-parallel ranks are whole groups of the context-parallel degree", () => {
    expect(dataParallelRanks(24, 16)).toBe(1);
    expect(dataParallelRanks(64, 4)).toBe(16);
  });
});

describe("the cheapest change that fits (stated order: keep checkpointing, smallest degree, fewest chunks)", () => {
  // 524 288 tokens, full checkpointing, flash, no vocabulary, 64 accelerators, 80e9 bytes; s·b·h = 2 147 483 648:
  //   cp 1: 1.75e9 + 137 438 953 472 + 73 014 444 032 = 212.2e9;  cp 2: 3.5e9 + 68.7e9 + 36.5e9 = 108.7e9
  //   cp 4: 7e9 + 34 359 738 368 + 18 253 611 008 = 59 613 349 376 ≤ 80e9
  it("524 288 tokens on 64 accelerators: context parallelism 4 (59 613 349 376 bytes)", () => {
    const input = { ...at4k, sequenceLength: 524_288 };
    const m = trainingMemoryPerAccelerator(input);
    expect(largestMemoryTerm(m)).toBe("activationCheckpoints");
    const resolved = {
      ...input,
      activationCheckpointing: "full" as const,
      flashAttention: true,
      contextParallel: 1,
      lossChunks: 1,
      microBatchSequences: 1,
      optimizerBytesPerParameter: 16,
    };
    expect(cheapestFit(resolved, 80e9)).toEqual({
      activationCheckpointing: "full",
      contextParallel: 4,
      lossChunks: 1,
      total: 59_613_349_376,
    });
    // 8 accelerators: cp 8 leaves 1 rank, model states 112e9 alone exceed 80e9; nothing fits
    expect(cheapestFit({ ...resolved, accelerators: 8 }, 80e9)).toBeNull();
  });

  // 8e9 parameters, V = 128 256, 131 072 tokens, 64 accelerators: states 8e9 × 16 ÷ 64 = 2e9,
  //   checkpoints 2 × 131 072 × 4096 × 32 = 34 359 738 368, workspace 34 × 131 072 × 4096 = 18 253 611 008,
  //   logits 131 072 × 128 256 × 4 = 67 243 081 728 (the largest) → total 121 856 431 104 > 80e9;
  //   2 chunks: 88 234 890 240 > 80e9; 4 chunks: 2e9 + 34 359 738 368 + 18 253 611 008 + 16 810 770 432 = 71 424 119 808
  it("a 128k stage whose logits dominate: four loss chunks, no extra parallelism", () => {
    const model = { ...SHAPE_7B, parameters: 8e9, kvHeads: 8, vocabSize: 128_256 };
    const input = { model, sequenceLength: 131_072, accelerators: 64 };
    const m = trainingMemoryPerAccelerator(input);
    expect(m.total).toBe(121_856_431_104);
    expect(largestMemoryTerm(m)).toBe("logits");
    const resolved = {
      ...input,
      activationCheckpointing: "full" as const,
      flashAttention: true,
      contextParallel: 1,
      lossChunks: 1,
      microBatchSequences: 1,
      optimizerBytesPerParameter: 16,
    };
    expect(cheapestFit(resolved, 80e9)).toEqual({
      activationCheckpointing: "full",
      contextParallel: 1,
      lossChunks: 4,
      total: 71_424_119_808,
    });
  });
});
