import Papa from "papaparse";
import { EVIDENCE_KIND_INFO } from "../../../shared/schemas/evidence";
import type { EvidenceRows, FileKind, RegressionRow, RetrievalRow, TaskRow } from "../../engine/evidence/rows";
import { Invalid } from "../../platform/errors";
import { harnessRows } from "./harness";

/** Uploads above this are refused before parsing (the multipart limit refuses them earlier still). */
export const MAX_EVIDENCE_BYTES = 5 * 1024 * 1024;
export const MAX_EVIDENCE_ROWS = 100_000;

type Cell = { line: number; column: string; value: string };
const bad = (c: Pick<Cell, "line" | "column">, message: string): never => {
  throw new Invalid(`row ${c.line}, column ${c.column}: ${message}`, {
    [`row ${c.line}, column ${c.column}`]: message,
  });
};

function num(c: Cell, opts: { integer?: boolean; min?: number; max?: number; minLabel?: string } = {}) {
  const text = c.value.trim();
  const v = text === "" ? NaN : Number(text);
  if (!Number.isFinite(v)) bad(c, `"${c.value.slice(0, 40)}" is not a number`);
  if (opts.integer && !Number.isInteger(v)) bad(c, `${v} is not a whole number`);
  if (opts.min !== undefined && v < opts.min) bad(c, `${v} is below ${opts.minLabel ?? opts.min}`);
  if (opts.max !== undefined && v > opts.max) bad(c, `${v} is above ${opts.max}`);
  return v;
}
function name(c: Cell) {
  const t = c.value.trim();
  if (!t) bad(c, "is empty");
  if (t.length > 200) bad(c, "is longer than 200 characters");
  return t;
}
const length = (c: Cell) => num(c, { integer: true, min: 1, max: 2 ** 31 - 1 });

/** Each kind's row reader and the key that must be unique (two rows for one cell would be counted twice). */
const READERS = {
  passkey: retrieval,
  needle: retrieval,
  ruler: (cell: (col: string) => Cell): [TaskRow, string] => {
    const row = { contextLength: length(cell("context_length")), task: name(cell("task")), score: 0 };
    row.score = num(cell("score"), { min: 0, max: 1 });
    return [row, `${row.contextLength}|${row.task}`];
  },
  perplexity: (cell: (col: string) => Cell): [{ contextLength: number; perplexity: number }, string] => {
    const contextLength = length(cell("context_length"));
    // Perplexity is exp(mean negative log-likelihood) and the likelihood is at most 1, so it is never below 1.
    const perplexity = num(cell("perplexity"), { min: 1, minLabel: "1 (perplexity is exp of a non-negative loss)" });
    return [{ contextLength, perplexity }, String(contextLength)];
  },
  short_regression: (cell: (col: string) => Cell): [RegressionRow, string] => {
    const row = { benchmark: name(cell("benchmark")), baseline: num(cell("baseline")), tuned: num(cell("tuned")) };
    return [row, row.benchmark];
  },
} satisfies Record<FileKind, (cell: (col: string) => Cell) => [unknown, string]>;

function retrieval(cell: (col: string) => Cell): [RetrievalRow, string] {
  const contextLength = length(cell("context_length"));
  const depth = num(cell("depth"), { min: 0, max: 1 });
  const trials = num(cell("trials"), { integer: true, min: 1 });
  const correct = num(cell("correct"), { integer: true, min: 0 });
  if (correct > trials) bad(cell("correct"), `${correct} correct out of ${trials} trials`);
  return [{ contextLength, depth, trials, correct }, `${contextLength}|${depth}`];
}

function csvRows(kind: FileKind, text: string): EvidenceRows {
  const expected = EVIDENCE_KIND_INFO[kind].csvHeader!;
  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: "greedy" });
  const [header, ...data] = parsed.data;
  if (!header) throw new Invalid("the file has no rows", { file: "the file has no rows" });
  const cols = header.map((h) => h.trim());
  const missing = expected.filter((c) => !cols.includes(c));
  const extra = cols.filter((c) => !expected.includes(c));
  if (missing.length || extra.length) {
    const message = `a ${kind} file has the columns ${expected.join(",")}${missing.length ? `; missing ${missing.join(", ")}` : ""}${extra.length ? `; unknown ${extra.join(", ")}` : ""}`;
    throw new Invalid(`row 1: ${message}`, { "row 1": message });
  }
  if (data.length === 0) throw new Invalid("the file has a header but no data rows", { file: "no data rows" });
  if (data.length > MAX_EVIDENCE_ROWS)
    throw new Invalid(`at most ${MAX_EVIDENCE_ROWS} rows`, { file: `more than ${MAX_EVIDENCE_ROWS} rows` });
  const seen = new Map<string, number>();
  const rows = data.map((values, i) => {
    const line = i + 2; // the header is row 1
    if (values.length !== cols.length)
      throw new Invalid(`row ${line}: ${values.length} cells, the header has ${cols.length}`, {
        [`row ${line}`]: `${values.length} cells, the header has ${cols.length}`,
      });
    const cell = (column: string): Cell => ({ line, column, value: values[cols.indexOf(column)] ?? "" });
    const [row, key] = READERS[kind](cell);
    const first = seen.get(key);
    if (first !== undefined)
      throw new Invalid(`row ${line} repeats row ${first}`, { [`row ${line}`]: `repeats row ${first} (${key})` });
    seen.set(key, line);
    return row;
  });
  return { kind, rows } as EvidenceRows;
}

/** Reads an uploaded evidence file: our CSV for the kind, or the evaluation harness's results JSON (harness.ts). */
export function parseEvidence(kind: FileKind, bytes: Buffer): EvidenceRows {
  if (bytes.length === 0) throw new Invalid("the file is empty", { file: "the file is empty" });
  if (bytes.length > MAX_EVIDENCE_BYTES)
    throw new Invalid(`the file is larger than ${MAX_EVIDENCE_BYTES / 1024 / 1024} MB`, { file: "too large" });
  const text = bytes.toString("utf8").replace(/^\uFEFF/, "");
  if (text.trim() === "") throw new Invalid("the file is empty", { file: "the file is empty" });
  if (text.trimStart().startsWith("{")) return harnessRows(kind, text);
  return csvRows(kind, text);
}
