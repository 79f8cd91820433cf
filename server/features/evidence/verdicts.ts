import type { AcceptanceCriterion } from "../../../shared/schemas/plans";
import type { CriterionVerdict, Provenance } from "../../../shared/schemas/evidence-api";
import { evaluateCriterion, provenanceShortfall, type ParityCheck } from "../../engine/evidence/evaluate";
import type { EvidenceRows } from "../../engine/evidence/rows";

export interface StoredEvidence {
  id: number;
  kind: string;
  rows: unknown;
  provenance: Provenance;
}

/**
 * Each acceptance criterion against the evidence of its kind. Any upload of that kind whose provenance falls short of
 * the criterion's length (engine/evidence/evaluate.ts provenanceShortfall) makes the verdict `insufficient`: a pass on
 * inputs shorter than the length named proves nothing about that length.
 */
export function verdicts(
  criteria: AcceptanceCriterion[],
  evidence: StoredEvidence[],
  ctx: { trainedContext: number; parity: ParityCheck | null },
): CriterionVerdict[] {
  return criteria.map((c, index) => {
    const base = {
      index,
      kind: c.kind ?? null,
      evaluation: c.evaluation,
      contextLength: c.contextLength,
      comparison: c.comparison,
      threshold: c.threshold,
    };
    if (!c.kind)
      return {
        ...base,
        status: "no_data" as const,
        observed: null,
        reason: "the criterion has no kind, so no evidence can decide it; give it one in a new revision",
        evidenceIds: [],
        warnings: [],
      };
    const mine = evidence.filter((e) => e.kind === c.kind);
    const result = evaluateCriterion(
      { ...c, kind: c.kind },
      mine.map((e) => ({ kind: e.kind, rows: e.rows }) as EvidenceRows),
      ctx,
    );
    const warnings =
      c.kind === "parity" || c.kind === "short_regression"
        ? []
        : mine.flatMap((e) => {
            const w = provenanceShortfall(c.contextLength, e.provenance.buckets);
            return w ? [`evidence ${e.id}: ${w}`] : [];
          });
    const insufficient = warnings.length > 0 && result.status !== "no_data";
    return {
      ...base,
      ...result,
      status: insufficient ? ("insufficient" as const) : result.status,
      reason: insufficient ? `${warnings.join("; ")} (${result.reason})` : result.reason,
      evidenceIds: mine.map((e) => e.id),
      warnings,
    };
  });
}
