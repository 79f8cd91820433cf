import { inverseFrequencies } from "../../engine/frequencies";
import { scanSupportedLength } from "../../engine/base-bound";
import type { AdoptedBaseSupport, RevisionContent } from "../../../shared/schemas/plans";
import { rotaryDimension } from "../../../shared/schemas";
import { rotaryShapeOf } from "../../../shared/profile-shapes";

/**
 * The bases a plan adopts (method "base": b′ for the plan's final block and for any stage), each with its complete
 * supported length under the Men et al. 2024 bound (B(m) = Σ cos(m·θ_i) ≥ 0 for every m below it), scanned to the
 * length that base must reach. The analysis inside the content scans the model's own base with a budget and may
 * stop early ("scan incomplete"); these scans run to the end, so they always say whether the adopted base reaches.
 * Kept beside the content (its own column), so content hashes of existing revisions never change.
 */
export function adoptedBaseSupport(content: RevisionContent): AdoptedBaseSupport[] {
  const d = rotaryDimension(rotaryShapeOf(content.model));
  if (d === null) return [];
  // Each adopted base must reach the longest length any block using it targets.
  const needed = new Map<number, number>();
  const adopt = (method: { method: string; base?: number }, target: number) => {
    if (method.method === "base" && typeof method.base === "number")
      needed.set(method.base, Math.max(needed.get(method.base) ?? 0, target));
  };
  adopt(content.method as { method: string; base?: number }, content.targetContext);
  for (const s of content.stages) adopt(s.method as { method: string; base?: number }, s.targetContext);
  return [...needed].map(([base, target]) => {
    const scan = scanSupportedLength(inverseFrequencies(d, base), target);
    return {
      base,
      target,
      supportedLength: scan.supportedLength,
      reachesTarget: scan.supportedLength === null,
    };
  });
}

/** The stored answer, or for a row written before the column existed, computed now (it depends on content alone). */
export const adoptedBaseSupportOfRow = (row: { baseSupport: unknown; content: unknown }) =>
  (row.baseSupport as AdoptedBaseSupport[] | null) ?? adoptedBaseSupport(row.content as RevisionContent);
