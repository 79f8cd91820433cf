import type { ProvenanceBucket } from "../../../shared/schemas/evidence";
import type {
  CriterionResult,
  EvidenceCriterion,
  EvidenceRows,
  PerplexityRow,
  RegressionRow,
  RetrievalRow,
  TaskRow,
} from "./rows";

/** The latest probe check recorded on the revision (issue 10), for `parity` criteria. */
export interface ParityCheck {
  passed: boolean;
  maxRelativeError: number | null;
}

export interface EvaluationContext {
  /** the length the plan extends from: perplexity ratios divide by the perplexity there */
  trainedContext: number;
  parity: ParityCheck | null;
}

const compare = (observed: number, c: EvidenceCriterion) =>
  c.comparison === ">="
    ? observed >= c.threshold
    : c.comparison === ">"
      ? observed > c.threshold
      : c.comparison === "<="
        ? observed <= c.threshold
        : observed < c.threshold;

const verdict = (observed: number, c: EvidenceCriterion, what: string, extra: Partial<CriterionResult> = {}) => ({
  status: compare(observed, c) ? ("pass" as const) : ("fail" as const),
  observed,
  reason: `${what} = ${observed.toPrecision(6)}, must be ${c.comparison} ${c.threshold}`,
  ...extra,
});

const noData = (reason: string, extra: Partial<CriterionResult> = {}): CriterionResult => ({
  status: "no_data",
  observed: null,
  reason,
  ...extra,
});

const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;

function passkey(c: EvidenceCriterion, rows: RetrievalRow[]): CriterionResult {
  const at = rows.filter((r) => r.contextLength === c.contextLength);
  const trials = at.reduce((s, r) => s + r.trials, 0);
  if (trials === 0) return noData(`no passkey trials at ${c.contextLength} tokens`);
  return verdict(at.reduce((s, r) => s + r.correct, 0) / trials, c, `accuracy at ${c.contextLength} tokens`);
}

function needle(c: EvidenceCriterion, rows: RetrievalRow[]): CriterionResult {
  const cells = rows.filter((r) => r.contextLength <= c.contextLength && r.trials > 0);
  if (!cells.some((r) => r.contextLength === c.contextLength))
    return noData(`no needle cells at ${c.contextLength} tokens`);
  const recalls = cells.map((r) => r.correct / r.trials);
  const how = c.aggregate ?? "min";
  const observed = how === "min" ? Math.min(...recalls) : mean(recalls);
  return verdict(observed, c, `${how} recall over ${cells.length} cells up to ${c.contextLength} tokens`);
}

/** Mean task score per length, ascending by length. */
function scoresByLength(rows: TaskRow[]) {
  const by = new Map<number, number[]>();
  for (const r of rows) by.set(r.contextLength, [...(by.get(r.contextLength) ?? []), r.score]);
  return [...by.entries()].sort((a, b) => a[0] - b[0]).map(([length, s]) => ({ length, score: mean(s) }));
}

/**
 * Effective length: the longest measured length up to which the mean score stays at or above the threshold at every
 * measured length (Hsieh et al. 2024, "RULER: What's the Real Context Size of Your Long-Context Language Models?", §4:
 * the maximum length whose performance exceeds a threshold; we require every shorter length to pass too, so one lucky
 * long length cannot lift it). Null when the shortest length already misses.
 */
export function effectiveLength(rows: TaskRow[], threshold: number): number | null {
  let longest: number | null = null;
  for (const { length, score } of scoresByLength(rows)) {
    if (score < threshold) break;
    longest = length;
  }
  return longest;
}

function ruler(c: EvidenceCriterion, rows: TaskRow[]): CriterionResult {
  const eff = effectiveLength(rows, c.threshold);
  const at = scoresByLength(rows).find((s) => s.length === c.contextLength);
  if (!at) return noData(`no task scores at ${c.contextLength} tokens`, { effectiveLength: eff });
  return verdict(at.score, c, `mean task score at ${c.contextLength} tokens`, { effectiveLength: eff });
}

function perplexity(c: EvidenceCriterion, rows: PerplexityRow[], ctx: EvaluationContext): CriterionResult {
  const at = rows.find((r) => r.contextLength === c.contextLength);
  const trained = rows.find((r) => r.contextLength === ctx.trainedContext)?.perplexity ?? null;
  if (!at) return noData(`no perplexity at ${c.contextLength} tokens`, { trainedPerplexity: trained });
  if ((c.measure ?? "perplexity") === "perplexity")
    return verdict(at.perplexity, c, `perplexity at ${c.contextLength} tokens`, { trainedPerplexity: trained });
  if (trained === null)
    return noData(`the ratio needs a perplexity at the trained length (${ctx.trainedContext} tokens)`, {
      trainedPerplexity: null,
    });
  return verdict(at.perplexity / trained, c, `perplexity ratio ${c.contextLength} ÷ ${ctx.trainedContext} tokens`, {
    trainedPerplexity: trained,
  });
}

function shortRegression(c: EvidenceCriterion, rows: RegressionRow[]): CriterionResult {
  const named = c.benchmarks?.length ? c.benchmarks : rows.map((r) => r.benchmark);
  const missing = named.filter((b) => !rows.some((r) => r.benchmark === b));
  if (named.length === 0 || missing.length) return noData(`no scores for ${missing.join(", ") || "any benchmark"}`);
  const losses = named.map((b) => {
    const r = rows.find((x) => x.benchmark === b)!;
    return r.baseline - r.tuned;
  });
  // δ is an upper bound on the loss whatever comparison was stored: the kind fixes its direction.
  return verdict(
    Math.max(...losses),
    { ...c, comparison: c.comparison.startsWith("<") ? c.comparison : "<=" },
    "largest loss (baseline − tuned)",
  );
}

function parity(c: EvidenceCriterion, ctx: EvaluationContext): CriterionResult {
  if (!ctx.parity) return noData("no probe check recorded on this revision");
  const e = ctx.parity.maxRelativeError;
  if (e === null) return { status: "fail", observed: null, reason: "the probe's frequencies could not be compared" };
  return {
    status: ctx.parity.passed ? "pass" : "fail",
    observed: e,
    reason: `worst relative error ${e.toExponential(2)} (float32 tolerance 1e-6)`,
  };
}

/** One criterion against every piece of evidence of its kind (rows of several uploads are pooled). */
export function evaluateCriterion(
  c: EvidenceCriterion,
  evidence: EvidenceRows[],
  ctx: EvaluationContext,
): CriterionResult {
  if (c.kind === "parity") return parity(c, ctx);
  const mine = evidence.filter((e) => e.kind === c.kind);
  if (mine.length === 0) return noData(`no ${c.kind} evidence uploaded`);
  const rows = mine.flatMap((e) => e.rows as never[]);
  switch (c.kind) {
    case "passkey":
      return passkey(c, rows);
    case "needle":
      return needle(c, rows);
    case "ruler":
      return ruler(c, rows);
    case "perplexity":
      return perplexity(c, rows, ctx);
    case "short_regression":
      return shortRegression(c, rows);
  }
}

/**
 * Inputs shorter than the criterion claims: when the smallest actual token count of the bucket at the criterion's length
 * falls below (1 − tolerance) × that length, the run never tested the length it names. Tolerance 5% by default: chat
 * templates and tokenizer differences move counts by a few percent (common practice, no source).
 */
export function provenanceShortfall(
  contextLength: number,
  buckets: ProvenanceBucket[],
  tolerance = 0.05,
): string | null {
  const b = buckets.find((x) => x.contextLength === contextLength);
  if (!b) return `the provenance has no token counts for the ${contextLength}-token bucket`;
  const floor = contextLength * (1 - tolerance);
  if (b.minTokens < floor)
    return `inputs in the ${contextLength}-token bucket were as short as ${b.minTokens} tokens (mean ${b.meanTokens}); at least ${Math.ceil(floor)} expected (tolerance ${tolerance * 100}%)`;
  return null;
}
