import type { ExportRequest } from "@shared/schemas/exports";
import type { RevisionContent } from "@shared/schemas/plans";
import { rotaryShapeOf } from "@shared/profile-shapes";

/** The revision's final block as POST /api/exports asks for it: its frozen model snapshot, target and method. */
export const exportRequestOf = (content: RevisionContent): ExportRequest => ({
  model: rotaryShapeOf(content.model),
  targetContext: content.targetContext,
  method: content.method,
});
