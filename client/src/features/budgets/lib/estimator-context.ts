import type { ModelRequest } from "@shared/schemas/budget";
import { parseNumberText } from "@/lib/number-text";
import { type SheetContext, type StageDraft } from "./sheet-draft";

/**
 * The estimator's growth-curve start: the profile's trained length when it is no longer than the longest stage
 * (the curve runs from it to 4 × the longest stage); otherwise the server's default, the shortest stage.
 */
export function estimatorContext(
  model: ModelRequest | null,
  trainedContext: number | undefined,
  stages: StageDraft[],
): SheetContext | null {
  if (!model) return null;
  const longest = Math.max(0, ...stages.map((s) => parseNumberText(s.sequenceLength) ?? 0).filter(Number.isFinite));
  return trainedContext !== undefined && trainedContext <= longest ? { model, trainedContext } : { model };
}
