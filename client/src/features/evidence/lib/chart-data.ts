import { z } from "zod";
import type { Evidence } from "@shared/schemas/evidence-api";

/*
 * The stored rows of every upload of one kind, merged the way the verdicts read them (all uploads of a kind count
 * together, server/features/evidence/verdicts.ts), shaped for the charts. Rows are checked against their shape here,
 * so a chart never draws a NaN.
 */
const retrievalRow = z.object({
  contextLength: z.number(),
  depth: z.number(),
  trials: z.number(),
  correct: z.number(),
});
const taskRow = z.object({ contextLength: z.number(), task: z.string(), score: z.number() });
const perplexityRow = z.object({ contextLength: z.number(), perplexity: z.number() });
const regressionRow = z.object({ benchmark: z.string(), baseline: z.number(), tuned: z.number() });

function rowsOf<T>(evidence: Evidence[], kinds: string[], schema: z.ZodType<T>): T[] {
  return evidence
    .filter((e) => kinds.includes(e.kind))
    .flatMap((e) => e.rows.flatMap((r) => (schema.safeParse(r).success ? [schema.parse(r)] : [])));
}

const sortedUnique = (values: number[]) => [...new Set(values)].sort((a, b) => a - b);

export type GridCell = { length: number; depth: number; trials: number; correct: number; rate: number };
export type RetrievalGrid = { lengths: number[]; depths: number[]; cells: GridCell[] };

/** Length × depth cells: Σ correct ÷ Σ trials of every row in the cell (several uploads may fill one cell). */
export function retrievalGrid(evidence: Evidence[], kind: "passkey" | "needle"): RetrievalGrid {
  const rows = rowsOf(evidence, [kind], retrievalRow);
  const sums = new Map<string, GridCell>();
  for (const r of rows) {
    const key = `${r.contextLength}|${r.depth}`;
    const cell = sums.get(key) ?? { length: r.contextLength, depth: r.depth, trials: 0, correct: 0, rate: 0 };
    cell.trials += r.trials;
    cell.correct += r.correct;
    sums.set(key, cell);
  }
  const cells = [...sums.values()].map((c) => ({ ...c, rate: c.trials > 0 ? c.correct / c.trials : 0 }));
  return {
    lengths: sortedUnique(cells.map((c) => c.length)),
    depths: sortedUnique(cells.map((c) => c.depth)),
    cells,
  };
}

export type Point = { x: number; y: number };

/** Perplexity per length, one point per length (the last upload's value wins when two give the same length). */
export function perplexityPoints(evidence: Evidence[]): Point[] {
  const byLength = new Map<number, number>();
  for (const r of rowsOf(evidence, ["perplexity"], perplexityRow)) byLength.set(r.contextLength, r.perplexity);
  return [...byLength.entries()].map(([x, y]) => ({ x, y })).sort((a, b) => a.x - b.x);
}

export type TaskSeries = { task: string; points: Point[] };

/** Each task's score per length, and the mean over tasks per length (what a ruler criterion compares). */
export function taskSeries(evidence: Evidence[]): { tasks: TaskSeries[]; mean: Point[] } {
  const rows = rowsOf(evidence, ["ruler"], taskRow);
  const tasks = [...new Set(rows.map((r) => r.task))].sort().map((task) => ({
    task,
    points: rows
      .filter((r) => r.task === task)
      .map((r) => ({ x: r.contextLength, y: r.score }))
      .sort((a, b) => a.x - b.x),
  }));
  const mean = sortedUnique(rows.map((r) => r.contextLength)).map((x) => {
    const at = rows.filter((r) => r.contextLength === x);
    return { x, y: at.reduce((s, r) => s + r.score, 0) / at.length };
  });
  return { tasks, mean };
}

export type BenchmarkPair = { benchmark: string; baseline: number; tuned: number };

/** One baseline/tuned pair per benchmark, in the order first uploaded. */
export function benchmarkPairs(evidence: Evidence[]): BenchmarkPair[] {
  const byName = new Map<string, BenchmarkPair>();
  for (const r of rowsOf(evidence, ["short_regression"], regressionRow)) byName.set(r.benchmark, r);
  return [...byName.values()];
}

/**
 * Where a length falls on a row of evenly spaced columns (one per measured length): on a column's centre when it was
 * measured, between two columns by log-interpolation otherwise, clamped half a column past either end.
 */
export function columnPosition(value: number, lengths: number[], centre: (i: number) => number, step: number) {
  if (!lengths.length) return 0;
  const exact = lengths.indexOf(value);
  if (exact >= 0) return centre(exact);
  if (value < lengths[0]!) return centre(0) - step / 2;
  const last = lengths.length - 1;
  if (value > lengths[last]!) return centre(last) + step / 2;
  const i = lengths.findIndex((l) => l > value) - 1;
  const lo = lengths[i]!;
  const hi = lengths[i + 1]!;
  const t = (Math.log(value) - Math.log(lo)) / (Math.log(hi) - Math.log(lo));
  return centre(i) + t * (centre(i + 1) - centre(i));
}
