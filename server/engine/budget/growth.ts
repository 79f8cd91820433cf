import { BILLION, GROWTH_REACH } from "./defaults";
import { acceleratorCost, acceleratorHours, attentionFlopsPerToken, flopsPerToken } from "./flops";
import type { ActivationCheckpointing, ClusterSpec, FlopConvention, GrowthPoint, ModelShape } from "./types";

/**
 * `points` sequence lengths spaced evenly in log from `from` to `to`, rounded to whole tokens,
 * both ends exact; duplicates after rounding are dropped.
 */
export function logSpacedLengths(from: number, to: number, points: number): number[] {
  if (points < 2 || to <= from) return [from];
  const ratio = to / from;
  const lengths = Array.from({ length: points }, (_, k) =>
    k === points - 1 ? to : Math.round(from * ratio ** (k / (points - 1))),
  );
  return lengths.filter((length, k) => k === 0 || length !== lengths[k - 1]);
}

export interface GrowthInput {
  model: ModelShape;
  convention: FlopConvention;
  activationCheckpointing: ActivationCheckpointing;
  cluster: ClusterSpec;
  utilization: number;
  trainedContext: number;
  targetContext: number;
  points: number;
}

/** FLOPs per token and cost per billion tokens from the trained length to GROWTH_REACH × the target. */
export function growthCurve(input: GrowthInput): GrowthPoint[] {
  const { model, cluster, utilization, convention, activationCheckpointing } = input;
  const lengths = logSpacedLengths(input.trainedContext, GROWTH_REACH * input.targetContext, input.points);
  return lengths.map((sequenceLength) => {
    const perToken = flopsPerToken(model, sequenceLength, { convention, activationCheckpointing });
    // The attention share is taken before any recompute, of the plain training figure.
    const withoutRecompute = flopsPerToken(model, sequenceLength, { convention, activationCheckpointing: "none" });
    const hours = acceleratorHours(BILLION * perToken, cluster.peakFlops, utilization);
    return {
      sequenceLength,
      flopsPerToken: perToken,
      attentionShare: attentionFlopsPerToken(model, sequenceLength, convention) / withoutRecompute,
      acceleratorHoursPerBillionTokens: hours,
      costPerBillionTokens: acceleratorCost(hours, cluster.pricePerHour),
    };
  });
}
