import type { AnalysisRequest, ModelShape } from "../../../../../shared/schemas/analysis";
import type { ModelSnapshot, RevisionContent } from "../../../../../shared/schemas/plan-responses";

/** The engine's model shape from a revision's frozen profile (the analysis schema is strict: only these keys). */
export const shapeOf = (m: ModelSnapshot): ModelShape => ({
  headDim: m.headDim, ropeTheta: m.ropeTheta, trainedContext: m.trainedContext, partialRotaryFactor: m.partialRotaryFactor,
  layers: m.layers, attentionHeads: m.attentionHeads, kvHeads: m.kvHeads, hiddenSize: m.hiddenSize,
});

/** The engine run on a revision's frozen model, target and method: the same request the workbench makes. */
export const analysisRequestOf = (content: RevisionContent): AnalysisRequest => ({
  model: shapeOf(content.model),
  targetContext: content.targetContext,
  methods: [content.method],
  ...(content.bands ? { bands: content.bands } : {}),
});
