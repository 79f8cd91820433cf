import type { AnalysisResponse, MethodResult, ResolvedAnalysisRequest } from "../../shared/schemas/analysis";
import { DEFAULT_BANDS, rotaryDimension } from "../../shared/schemas/analysis";
import type { MethodContext } from "./types";
import { METHODS, runMethod } from "./methods";
import { classifyPairs, summarisePairs } from "./pairs";
import { criticalBase, criticalDimension, extrapolationBound } from "./extrapolation";
import { decayPositions } from "./decay";
import { type FrequencySet, frequencySet, keptDecayCurve, keptScan, modelFrequencies } from "./memo";

/** 1.1: config patches of models with multimodal sections carry them (docs/export-targets.md, "The signed block"). */
export const ENGINE_VERSION = "rw-engine/1.1.0";
/** Keeps the in-request scan near 4 ms even for huge bases or targets (an evaluation costs about 1 µs at d = 256); POST /api/bounds/base gives the full answer. */
export const ANALYSIS_SCAN_EVALUATIONS = 4_000;
export { METHODS, runMethod };
export type { MethodContext, MethodFn, MethodOutput, MethodTable } from "./types";

/**
 * The whole comparison for one model: per-method pair tables and flags, model-level bounds, decay curves.
 * Pure and synchronous; expects a request that passed resolvedAnalysisRequestSchema. Float64 throughout.
 */
export function analyse(request: ResolvedAnalysisRequest): AnalysisResponse {
  const { model, targetContext } = request;
  const d = rotaryDimension(model);
  if (d === null) throw new RangeError("rotary dimension must be a positive even integer (validate the request first)");
  const bands = request.bands ?? DEFAULT_BANDS;
  const ctx: MethodContext = {
    d,
    base: model.ropeTheta,
    trainedContext: model.trainedContext,
    targetContext,
    ...(model.mropeSection ? { mropeSection: model.mropeSection, mropeInterleaved: model.mropeInterleaved } : {}),
  };
  const invFreq = modelFrequencies(d, model.ropeTheta);
  const original = frequencySet(invFreq);
  const window = { trainedContext: model.trainedContext, targetContext, bands };
  const boundFor = (base: number) =>
    extrapolationBound({ d, originalBase: model.ropeTheta, trained: model.trainedContext, base, tune: targetContext });
  const positions = decayPositions(targetContext);

  const byMethod: Record<string, number[]> = {};
  const methods: MethodResult[] = request.methods.map((params, index) => {
    const out = runMethod(ctx, params);
    const scaled = Array.from(out.invFreq);
    const pairs = classifyPairs(invFreq, scaled, window);
    byMethod[String(index)] = keptDecayCurve(frequencySet(scaled), positions);
    return {
      method: out.params.method,
      params: out.params,
      attentionFactor: out.attentionFactor,
      effectiveBase: out.effectiveBase,
      pairs,
      summary: summarisePairs(pairs),
      extrapolationBound: out.effectiveBase === null ? null : boundFor(out.effectiveBase),
      ropeScaling: out.ropeScaling,
      notes: out.notes,
    };
  });

  return {
    engineVersion: ENGINE_VERSION,
    model: { ...model, partialRotaryFactor: model.partialRotaryFactor ?? 1, rotaryDim: d, pairs: d / 2 },
    targetContext,
    scale: targetContext / model.trainedContext,
    bands,
    criticalDimension: criticalDimension(d, model.ropeTheta, model.trainedContext),
    criticalBase: criticalBase(model.ropeTheta, model.trainedContext, targetContext),
    extrapolationBound: boundFor(model.ropeTheta),
    baseSupport: baseSupport(original, model.ropeTheta, targetContext),
    methods,
    decay: { positions, original: keptDecayCurve(original, positions), byMethod },
  };
}

function baseSupport(original: FrequencySet, base: number, targetContext: number) {
  const scan = keptScan(original, targetContext, ANALYSIS_SCAN_EVALUATIONS);
  const supportsTarget = scan.supportedLength !== null ? false : scan.complete ? true : null;
  return { base, ...scan, supportsTarget };
}
