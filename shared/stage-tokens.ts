import type { StageRequest as StageInput } from "./schemas/budget";

// The token rule of a training stage, read by the budget engine (server/engine/budget) and by the plan pages.

export interface StageTokens {
  steps: number;
  /** The requested token target, or null when steps were given. */
  tokenTarget: number | null;
  /** Tokens actually trained: steps × globalBatch × sequenceLength (≥ the target when one was given). */
  tokens: number;
}

/** Tokens in one optimizer step: sequences per step × tokens per sequence. */
export function tokensPerStep(stage: Pick<StageInput, "globalBatch" | "sequenceLength">): number {
  return stage.globalBatch * stage.sequenceLength;
}

/** Steps and tokens of a stage; a token target is met with whole steps: steps = ceil(tokens / (batch × length)). */
export function stageTokens(stage: StageInput): StageTokens {
  const perStep = tokensPerStep(stage);
  if (stage.steps !== undefined) return { steps: stage.steps, tokenTarget: null, tokens: stage.steps * perStep };
  const steps = Math.ceil(stage.tokens / perStep);
  return { steps, tokenTarget: stage.tokens, tokens: steps * perStep };
}

/** Running total of tokens after each stage. */
export function cumulativeTokens(tokens: number[]): number[] {
  let sum = 0;
  return tokens.map((t) => (sum += t));
}
