import { describe, expect, it } from "vitest";
import {
  kvCacheBytesPerSequence,
  kvCacheBytesPerToken,
  longestServableContext,
  servingSequencesPerAccelerator,
} from "../../../server/engine/budget";
import { SHAPE_7B } from "./fixtures";

// KV cache: a stated convention (docs/budget-conventions.md "KV cache"), not a published figure.
describe("KV cache (stated convention)", () => {
  // 2 · 32 layers · 32 KV heads · 128 · 2 bytes = 524 288
  it("524 288 bytes per token for 32 layers × 32 KV heads × 128 × 2 bytes", () => {
    expect(kvCacheBytesPerToken({ layers: 32, kvHeads: 32, headDim: 128, bytesPerElement: 2 })).toBe(524_288);
    expect(kvCacheBytesPerToken({ layers: 32, kvHeads: 32, headDim: 128 })).toBe(524_288); // 2 bytes by default
  });

  it("grouped-query attention counts KV heads: 8 KV heads → 131 072; an 8-bit cache halves it to 65 536", () => {
    expect(kvCacheBytesPerToken({ ...SHAPE_7B, kvHeads: 8 })).toBe(131_072);
    expect(kvCacheBytesPerToken({ ...SHAPE_7B, kvHeads: 8 }, 1)).toBe(65_536);
  });

  it("per sequence: 524 288 × 65 536 = 34 359 738 368 bytes = 32 GiB", () => {
    expect(kvCacheBytesPerSequence(SHAPE_7B, 65_536)).toBe(32 * 2 ** 30);
  });

  // 8 full-attention layers + 24 local layers with a 4096-token window, 8 KV heads of 128, 2 bytes:
  //   per layer per token 2 × 8 × 128 × 2 = 4096 bytes
  //   at 131 072 tokens: 8 × 4096 × 131 072 = 4 294 967 296 + 24 × 4096 × 4096 = 402 653 184 → 4 697 620 480
  //   at 2048 tokens (inside the window) every layer holds every token: 32 × 4096 × 2048 = 268 435 456
  it("local-window layers hold at most their window", () => {
    const model = {
      ...SHAPE_7B,
      kvHeads: 8,
      layerGroups: [
        { kind: "full_attention", layers: 8, slidingWindow: null },
        { kind: "sliding_attention", layers: 24, slidingWindow: 4096 },
      ],
    };
    expect(kvCacheBytesPerSequence(model, 131_072)).toBe(4_697_620_480);
    expect(kvCacheBytesPerSequence(model, 2048)).toBe(268_435_456);
  });

  // kv_lora_rank 512 + qk_rope_head_dim 64 = 576 elements per token per layer, 61 layers, 2 bytes:
  //   576 × 61 × 2 = 70 272 bytes per token, no factor 2
  it("latent attention: kvLatentDim · layers · bytes = 70 272 bytes per token", () => {
    const latent = { layers: 61, kvHeads: 128, headDim: 128, kvLatentDim: 576 };
    expect(kvCacheBytesPerToken(latent)).toBe(70_272);
    expect(kvCacheBytesPerSequence(latent, 1000)).toBe(70_272_000);
  });
});

describe("serving beside one copy of the weights", () => {
  // weights 7e9 × 2 = 14e9 bytes; free on 80e9 = 66e9
  //   at 65 536: 66e9 / 34 359 738 368 = 1.92 → 1;  at 4096: 66e9 / 2 147 483 648 = 30.7 → 30
  it("serving sequences per accelerator", () => {
    expect(servingSequencesPerAccelerator(SHAPE_7B, 65_536, 80e9)).toBe(1);
    expect(servingSequencesPerAccelerator(SHAPE_7B, 4096, 80e9)).toBe(30);
    // an 8-bit cache: 66e9 / 1 073 741 824 = 61.5 → 61
    expect(servingSequencesPerAccelerator(SHAPE_7B, 4096, 80e9, 1)).toBe(61);
  });

  it("0 when the weights alone do not fit (14e9 bytes of weights on 14e9 and 10e9 bytes)", () => {
    expect(servingSequencesPerAccelerator(SHAPE_7B, 4096, 14e9)).toBe(0);
    expect(longestServableContext(SHAPE_7B, 10e9)).toBe(0);
  });

  // 66e9 / 524 288 = 125 885.0098 → 125 885 tokens
  it("the longest context one accelerator serves: floor(66e9 ÷ 524 288) = 125 885", () => {
    expect(longestServableContext(SHAPE_7B, 80e9)).toBe(125_885);
    // one more token does not fit, the answer itself does
    expect(kvCacheBytesPerSequence(SHAPE_7B, 125_885)).toBeLessThanOrEqual(66e9);
    expect(kvCacheBytesPerSequence(SHAPE_7B, 125_886)).toBeGreaterThan(66e9);
  });

  it("a model whose every layer is windowed serves any length up to the schema's limit", () => {
    const local = { ...SHAPE_7B, layerGroups: [{ kind: "sliding_attention", layers: 32, slidingWindow: 4096 }] };
    expect(longestServableContext(local, 80e9)).toBe(2 ** 27);
  });
});
