import type { EvidenceRows, FileKind, RegressionRow, TaskRow } from "../../engine/evidence/rows";
import { Invalid } from "../../platform/errors";

/*
 * The common open evaluation harness (EleutherAI/lm-evaluation-harness, v0.4 results files) writes
 * { "results": { "<task>": { "<metric>,<filter>": number, "<metric>_stderr,<filter>": number, "alias": … } }, … }.
 * Its long-context synthetic suite reports one metric per sequence length, named by the length: process_results sets
 * `str(length)` for each configured length, -1 for lengths a sample did not have, and aggregate_metrics drops the -1s
 * and returns -1 when a length had no samples (lm_eval/tasks/ruler/common_utils.py, commit 2455a97). Scores there are
 * fractions, like ours.
 */

type Results = Record<string, Record<string, unknown>>;
const invalid = (message: string): never => {
  throw new Invalid(message, { file: message });
};

function resultsOf(json: unknown, where: string): Results {
  const r = (json as { results?: unknown } | null)?.results;
  if (!r || typeof r !== "object" || Array.isArray(r) || Object.keys(r).length === 0)
    invalid(`${where} has no "results" object with at least one task`);
  return r as Results;
}

function rulerRows(results: Results): TaskRow[] {
  const rows: TaskRow[] = [];
  for (const [task, metrics] of Object.entries(results)) {
    for (const [key, value] of Object.entries(metrics ?? {})) {
      const m = /^(\d+),/.exec(key);
      if (!m || typeof value !== "number" || value === -1) continue;
      if (!(value >= 0 && value <= 1)) invalid(`results.${task}["${key}"] = ${value} is not a score from 0 to 1`);
      rows.push({ contextLength: Number(m[1]), task, score: value });
    }
  }
  if (!rows.length) invalid('the results carry no per-length scores (metrics named by a length, such as "4096,none")');
  return rows;
}

/** The headline metric of a task: the first of these present, else the first number that is not a standard error. */
const PREFERRED = ["acc_norm", "acc", "exact_match", "f1", "score"];
function headline(task: string, metrics: Record<string, unknown>, where: string): number {
  const numeric = Object.entries(metrics ?? {}).filter(
    ([k, v]) => typeof v === "number" && !k.split(",")[0].endsWith("_stderr"),
  ) as [string, number][];
  for (const p of PREFERRED) {
    const hit = numeric.find(([k]) => k.split(",")[0] === p);
    if (hit) return hit[1];
  }
  if (!numeric.length) invalid(`${where}.results.${task} has no numeric metric`);
  return numeric[0][1];
}

function regressionRows(json: unknown): RegressionRow[] {
  const j = json as { baseline?: unknown; tuned?: unknown } | null;
  if (!j?.baseline || !j?.tuned)
    invalid(
      'a short-regression harness upload is { "baseline": <results file of the base model>, "tuned": <results file of the tuned model> }',
    );
  const base = resultsOf(j!.baseline, "baseline");
  const tuned = resultsOf(j!.tuned, "tuned");
  const rows = Object.keys(tuned)
    .filter((t) => t in base)
    .map((t) => ({ benchmark: t, baseline: headline(t, base[t], "baseline"), tuned: headline(t, tuned[t], "tuned") }));
  if (!rows.length) invalid("the baseline and tuned results share no task");
  return rows;
}

export function harnessRows(kind: FileKind, text: string): EvidenceRows {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    return invalid("the file starts like JSON but is not valid JSON");
  }
  if (kind === "ruler") return { kind, rows: rulerRows(resultsOf(json, "the file")) };
  if (kind === "short_regression") return { kind, rows: regressionRows(json) };
  return invalid(`${kind} evidence takes our CSV format; harness results map onto ruler and short_regression only`);
}
