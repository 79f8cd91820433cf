import type { EvidenceKind } from "../../../shared/schemas/evidence";

/** Parsed evidence rows, one shape per kind (the CSV formats of shared/schemas/evidence.ts). */
export interface RetrievalRow {
  contextLength: number;
  /** position of the hidden item: 0 = start of the context, 1 = end */
  depth: number;
  trials: number;
  correct: number;
}
export interface TaskRow {
  contextLength: number;
  task: string;
  /** fraction from 0 to 1 */
  score: number;
}
export interface PerplexityRow {
  contextLength: number;
  perplexity: number;
}
export interface RegressionRow {
  benchmark: string;
  baseline: number;
  tuned: number;
}

export type EvidenceRows =
  | { kind: "passkey" | "needle"; rows: RetrievalRow[] }
  | { kind: "ruler"; rows: TaskRow[] }
  | { kind: "perplexity"; rows: PerplexityRow[] }
  | { kind: "short_regression"; rows: RegressionRow[] };

export type FileKind = Exclude<EvidenceKind, "parity">;

/** A criterion as the evaluator needs it: the stored fields plus the kind's own options. */
export interface EvidenceCriterion {
  kind: EvidenceKind;
  contextLength: number;
  comparison: ">=" | ">" | "<=" | "<";
  threshold: number;
  /** needle: take the minimum (default) or the mean of the cells */
  aggregate?: "min" | "mean";
  /** perplexity: compare the perplexity itself (default) or its ratio to the trained length's */
  measure?: "perplexity" | "ratio";
  /** short_regression: the benchmarks that must not regress (default: every benchmark in the evidence) */
  benchmarks?: string[];
}

export type CriterionStatus = "pass" | "fail" | "no_data" | "insufficient";

export interface CriterionResult {
  status: CriterionStatus;
  /** the figure compared with the threshold, or null without data */
  observed: number | null;
  /** plain words: what was compared, or why there is no verdict */
  reason: string;
  /** ruler: the effective length at the criterion's threshold (null when even the shortest length misses it) */
  effectiveLength?: number | null;
  /** perplexity: perplexity at the trained length, when the evidence has it */
  trainedPerplexity?: number | null;
}
