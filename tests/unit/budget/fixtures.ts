import { expect } from "vitest";
import type { ClusterSpec, ModelShape, ResolvedBudgetInput } from "../../../server/engine/budget";

/**
 * A stated round shape for hand arithmetic (not a released model): N = 7e9, 32 layers,
 * 32 query heads and 32 KV heads of 128 → d_attn = hiddenSize = 4096.
 */
export const SHAPE_7B: ModelShape = { parameters: 7e9, layers: 32, attentionHeads: 32, kvHeads: 32, headDim: 128 };

/** A stated round accelerator: 1e15 dense FLOP/s, 80e9 bytes, 2 per hour. */
export const ROUND_ACCELERATOR: ClusterSpec = { peakFlops: 1e15, memoryBytes: 80e9, pricePerHour: 2 };

/** The YaRN recipe's stage (Peng et al. 2023): 400 steps at 65 536 tokens, global batch 64. */
export const YARN_STAGE = { sequenceLength: 65_536, steps: 400, globalBatch: 64 } as const;

export function plan(overrides: Partial<ResolvedBudgetInput> = {}): ResolvedBudgetInput {
  return { model: SHAPE_7B, cluster: ROUND_ACCELERATOR, accelerators: 64, stages: [YARN_STAGE], ...overrides };
}

/** |actual − expected| ≤ tolerance × |expected|: for figures past 2^53, where doubles round. */
export function expectRelative(actual: number, expected: number, tolerance = 1e-12) {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tolerance * Math.abs(expected));
}
