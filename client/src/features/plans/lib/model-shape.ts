import type { AnalysisRequest } from "@shared/schemas/analysis";
import type { RevisionContent } from "@shared/schemas/plans";
import { rotaryShapeOf } from "@shared/profile-shapes";

/** The engine run on a revision's frozen model, target and method: the same request the workbench makes. */
export const analysisRequestOf = (content: RevisionContent): AnalysisRequest => ({
  model: rotaryShapeOf(content.model),
  targetContext: content.targetContext,
  methods: [content.method],
  ...(content.bands ? { bands: content.bands } : {}),
});
