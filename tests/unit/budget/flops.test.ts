import { describe, expect, it } from "vitest";
import {
  acceleratorCost,
  acceleratorHours,
  attentionFlopsPerToken,
  flopsPerToken,
  parameterFlopsPerToken,
  stageTokens,
  wallClockHours,
} from "../../../server/engine/budget";
import { expectRelative, ROUND_ACCELERATOR, SHAPE_7B, YARN_STAGE } from "./fixtures";

describe("tokens per stage", () => {
  it("YaRN recipe: 400 steps × 64 sequences × 65 536 tokens = 1 677 721 600 (derived; Peng et al. 2023)", () => {
    expect(stageTokens(YARN_STAGE)).toEqual({ steps: 400, tokenTarget: null, tokens: 1_677_721_600 });
  });

  it("a token target is met with whole steps: ceil(1e9 / (64 × 65 536)) = ceil(238.4…) = 239 (derived)", () => {
    // 64 × 65 536 = 4 194 304 tokens per step; 1e9 / 4 194 304 = 238.418…; 239 × 4 194 304 = 1 002 438 656
    const result = stageTokens({ sequenceLength: 65_536, globalBatch: 64, tokens: 1e9 });
    expect(result).toEqual({ steps: 239, tokenTarget: 1e9, tokens: 1_002_438_656 });
  });

  it("a target that is an exact number of steps adds no extra step", () => {
    expect(stageTokens({ sequenceLength: 65_536, globalBatch: 64, tokens: 1_677_721_600 }).steps).toBe(400);
  });
});

describe("FLOPs per token for the stated 7e9 shape at n_ctx = 65 536", () => {
  // 6N = 6 × 7e9 = 42 000 000 000 (Kaplan et al. 2020, Eq. 2.2: training ≈ 3 × forward 2N)
  it("parameter term 6N", () => {
    expect(parameterFlopsPerToken(7e9)).toBe(42_000_000_000);
  });

  // causal (Kaplan et al. 2020, Eq. 2.2 / Table 1): 6 · n_layer · n_ctx · d_attn
  //   = 6 × 32 × 65 536 × 4096 = 192 × 65 536 × 4096 = 12 582 912 × 4096 = 51 539 607 552
  //   total = 42 000 000 000 + 51 539 607 552 = 93 539 607 552
  it("causal convention: 93 539 607 552", () => {
    expect(attentionFlopsPerToken(SHAPE_7B, 65_536, "causal")).toBe(51_539_607_552);
    expect(flopsPerToken(SHAPE_7B, 65_536, { convention: "causal", activationCheckpointing: "none" })).toBe(
      93_539_607_552,
    );
  });

  // full (Chowdhery et al. 2022, PaLM App. B): 12 · n_layer · n_heads · head_dim · n_ctx
  //   = 12 × 32 × 32 × 128 × 65 536 = 384 × 4096 × 65 536 = 103 079 215 104
  //   total = 42 000 000 000 + 103 079 215 104 = 145 079 215 104
  it("full convention: 145 079 215 104", () => {
    expect(attentionFlopsPerToken(SHAPE_7B, 65_536, "full")).toBe(103_079_215_104);
    expect(flopsPerToken(SHAPE_7B, 65_536, { convention: "full", activationCheckpointing: "none" })).toBe(
      145_079_215_104,
    );
  });

  it("the causal convention and full checkpointing are the defaults", () => {
    expect(flopsPerToken(SHAPE_7B, 65_536)).toBe(124_719_476_736);
  });

  // Full checkpointing re-runs the whole forward pass = 1/3 of training (identity): × 4/3.
  //   93 539 607 552 × 4/3 = 124 719 476 736
  // Selective re-runs the attention core (Korthikanti et al. 2022, Sec. 5): + attention ÷ 3
  //   = 93 539 607 552 + 51 539 607 552 ÷ 3 = 93 539 607 552 + 17 179 869 184 = 110 719 476 736
  it("checkpointing adds its recompute: full × 4/3, selective + attention ÷ 3, none nothing", () => {
    expect(flopsPerToken(SHAPE_7B, 65_536, { activationCheckpointing: "full" })).toBe(124_719_476_736);
    expect(flopsPerToken(SHAPE_7B, 65_536, { activationCheckpointing: "selective" })).toBe(110_719_476_736);
    expect(flopsPerToken(SHAPE_7B, 65_536, { activationCheckpointing: "none" })).toBe(93_539_607_552);
  });

  it("head count and head dimension enter as d_attn = n_heads · head_dim, not hiddenSize", () => {
    const wideHeads = { ...SHAPE_7B, attentionHeads: 16, headDim: 256, hiddenSize: 9999 };
    expect(attentionFlopsPerToken(wideHeads, 65_536, "causal")).toBe(51_539_607_552);
  });
});

describe("accelerator-hours, wall clock and cost of the YaRN stage, by hand", () => {
  // FLOPs (causal) = 93 539 607 552 × 1 677 721 600 = 156 933 420 045 513 523 200 ≈ 1.5693e20
  // effective rate = 1e15 × 0.4 = 4e14 FLOP/s → 1.44e18 FLOP per accelerator-hour
  // hours = 1.569334e20 / 1.44e18 = 108.98154169827…; on 64 accelerators 1.70283658903…; cost at 2/h = 217.9630833965…
  const flops = 93_539_607_552 * 1_677_721_600;

  it("hours", () => {
    expectRelative(flops, 156_933_420_045_513_523_200, 1e-15);
    const hours = acceleratorHours(flops, ROUND_ACCELERATOR.peakFlops, 0.4);
    expectRelative(hours, 108.98154169827328);
    expectRelative(wallClockHours(hours, 64), 1.70283658903552);
    expectRelative(acceleratorCost(hours, ROUND_ACCELERATOR.pricePerHour), 217.96308339654655);
  });

  it("full convention: 145 079 215 104 × 1 677 721 600 / 1.44e18 = 169.0295… hours, cost 338.059…", () => {
    const hours = acceleratorHours(145_079_215_104 * 1_677_721_600, 1e15, 0.4);
    expectRelative(hours, 169.02953672987988);
    expectRelative(acceleratorCost(hours, 2), 338.05907345975976);
  });
});
