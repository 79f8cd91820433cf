import type { AnalysisResponse, MethodParams } from "@shared/schemas/analysis";
import { METHOD_LABELS } from "./method-fields";

/**
 * The commented header of the workbench's pair CSV: which model, method, parameters and engine produced the rows,
 * so a file read months later (or by someone else) still says what it is. One `# key: value` line each, before the
 * column names; CSV readers skip them with a comment setting (pandas `comment="#"`, Papa Parse `comments: "#"`).
 * Structured values are JSON on one line, so the header parses back exactly (`readPairCsvHeader`).
 */
export type PairCsvHeader = {
  /** The rotary shape analysed: d, b, L, partial rotary factor. */
  model: { rotaryDim: number; headDim: number; ropeTheta: number; trainedContext: number; partialRotaryFactor: number };
  /** The saved profile the shape came from, when the analysis named one; null for a typed-in shape or a layer group. */
  profile: string | null;
  /** Our method id, then its name as the catalog gives it. */
  method: string;
  "method name": string;
  /** The parameters the engine used, defaults filled in (the request member echoed by the analysis). */
  parameters: MethodParams;
  "target length": number;
  bands: { alpha: number; beta: number };
  "engine version": string;
  /** "all pairs" or "flagged pairs only", and the column order as shown. */
  rows: string;
};

const JSON_KEYS = new Set(["model", "parameters", "target length", "bands"]);
const KEYS: (keyof PairCsvHeader)[] = [
  "model",
  "profile",
  "method",
  "method name",
  "parameters",
  "target length",
  "bands",
  "engine version",
  "rows",
];

/** The header for one method of an analysis. */
export function pairCsvHeader(
  analysis: AnalysisResponse,
  methodIndex: number,
  profile: string | null,
  flaggedOnly: boolean,
): PairCsvHeader {
  const m = analysis.methods[methodIndex];
  const { rotaryDim, headDim, ropeTheta, trainedContext, partialRotaryFactor } = analysis.model;
  return {
    model: { rotaryDim, headDim, ropeTheta, trainedContext, partialRotaryFactor },
    profile,
    method: m.method,
    "method name": METHOD_LABELS[m.method],
    parameters: m.params,
    "target length": analysis.targetContext,
    bands: analysis.bands,
    "engine version": analysis.engineVersion,
    rows: flaggedOnly ? "flagged pairs only" : "all pairs",
  };
}

/**
 * `# key: value` lines ending in CRLF, the line ending of the table under them (RFC 4180; Papa Parse's unparse):
 * a reader that guesses the line ending from the first lines then splits the table right. Line breaks inside a
 * text value are flattened so each key stays one line.
 */
export function formatPairCsvHeader(header: PairCsvHeader): string {
  return KEYS.map((k) => {
    const v = header[k];
    const text = JSON_KEYS.has(k) ? JSON.stringify(v) : v === null ? "none" : String(v).replace(/[\r\n]+/g, " ");
    return `# ${k}: ${text}\r\n`;
  }).join("");
}

/** Reads the header back from a downloaded file: the leading `# key: value` lines, JSON values decoded. */
export function readPairCsvHeader(csv: string): Partial<PairCsvHeader> {
  const out: Record<string, unknown> = {};
  for (const line of csv.split(/\r?\n/)) {
    const match = /^# ([^:]+): (.*)$/.exec(line);
    if (!match) break;
    const [, key, value] = match;
    out[key] = JSON_KEYS.has(key) ? JSON.parse(value) : key === "profile" && value === "none" ? null : value;
  }
  return out as Partial<PairCsvHeader>;
}
