import { nestRopeParameters } from "../../engine/layer-nesting";
import type { RevisionContent } from "./revision-content";

/**
 * What a layered revision exports beside the scaled group's block: every group's own block, and the v5 nesting.
 * A group the plan leaves as trained exports exactly its trained setting: its own base, no scaling block.
 */
export function layeredExport(content: RevisionContent) {
  const groups = content.results.groups;
  if (!groups) return {};
  return {
    layerGroups: groups.map((g) => ({
      kind: g.kind,
      layers: g.layers,
      method: g.method,
      attentionFactor: g.attentionFactor,
      ropeTheta: g.ropeTheta,
      config: g.patch,
    })),
    ropeParametersByLayerType: nestRopeParameters(
      groups.map((g) => ({
        kind: g.kind,
        ropeTheta: g.ropeTheta,
        block: g.patch.rope_scaling as Record<string, unknown> | null,
      })),
    ),
  };
}
