import type { EvidenceKind } from "@shared/schemas/evidence";
import type { CriterionVerdict } from "@shared/schemas/evidence-api";

/** The options of a criterion that change what its figure means (from the revision's acceptance criteria). */
export type CriterionOptions = { measure?: "perplexity" | "ratio"; aggregate?: "min" | "mean"; benchmarks?: string[] };

const COMPARE: Record<string, string> = { ">=": "≥", ">": ">", "<=": "≤", "<": "<" };
export const comparisonSign = (c: string) => COMPARE[c] ?? c;

const fixed = (v: number, digits = 3) => (Number.isInteger(v) ? String(v) : v.toFixed(digits));
const percent = (v: number) => `${(v * 100).toFixed(1)} %`;

/** A figure of the criterion's kind with its unit: fractions also as percent, perplexity ratios as a multiple. */
export function formatFigure(kind: EvidenceKind | null, value: number, options: CriterionOptions = {}): string {
  switch (kind) {
    case "passkey":
    case "needle":
    case "ruler":
      return `${fixed(value)} (${percent(value)})`;
    case "perplexity":
      return options.measure === "ratio"
        ? `${fixed(value)} × trained-length perplexity`
        : `perplexity ${fixed(value, 2)}`;
    case "short_regression":
      return `${fixed(value)} score lost`;
    case "parity":
      return `${value === 0 ? "0" : value.toExponential(2)} relative error`;
    default:
      return fixed(value);
  }
}

/** What the observed figure is measured as, for the column heading of one criterion. */
export function measuredAs(kind: EvidenceKind | null, options: CriterionOptions = {}): string {
  switch (kind) {
    case "passkey":
      return "accuracy at the length";
    case "needle":
      return `${options.aggregate === "mean" ? "mean" : "minimum"} recall over the grid`;
    case "ruler":
      return "mean task score at the length";
    case "perplexity":
      return options.measure === "ratio" ? "perplexity ÷ perplexity at the trained length" : "perplexity at the length";
    case "short_regression":
      return `largest loss on ${options.benchmarks?.length ? options.benchmarks.join(", ") : "every benchmark"}`;
    case "parity":
      return "worst relative error of the latest probe";
    default:
      return "no kind";
  }
}

/** "0.950 (95.0 %) against ≥ 0.9 (90.0 %)", or why there is no figure. */
export function observedAgainstThreshold(v: CriterionVerdict, options: CriterionOptions = {}): string {
  const bar = `${comparisonSign(v.comparison)} ${formatFigure(v.kind, v.threshold, options)}`;
  return v.observed === null
    ? `no figure yet; must be ${bar}`
    : `${formatFigure(v.kind, v.observed, options)}, must be ${bar}`;
}
