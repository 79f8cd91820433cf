import type { ExportRequest } from "@shared/schemas/exports";
import type { RevisionContent } from "@shared/schemas/plans";
import { rotaryShapeOf } from "@shared/profile-shapes";

/**
 * The revision's final block as POST /api/exports asks for it: its frozen model snapshot, target and method, and for a
 * layered model its groups and their methods, so the matrix and the fingerprint cover every group; a model with
 * multimodal sections its sections, so the rigging keeps them.
 */
export const exportRequestOf = (content: RevisionContent): ExportRequest => ({
  model: rotaryShapeOf(content.model),
  targetContext: content.targetContext,
  method: content.method,
  ...(content.model.layerGroups ? { layerGroups: content.model.layerGroups } : {}),
  ...(content.groupMethods?.length ? { groupMethods: content.groupMethods } : {}),
  ...(content.model.mropeSection?.length
    ? { mropeSection: content.model.mropeSection, mropeInterleaved: content.model.mropeInterleaved === true }
    : {}),
});
