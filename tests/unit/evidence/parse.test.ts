import { describe, expect, it } from "vitest";
import { MAX_EVIDENCE_BYTES, parseEvidence } from "../../../server/features/evidence/parse";
import { AppError } from "../../../server/platform/errors";

const csv = (s: string) => Buffer.from(s);
function refusal(f: () => unknown) {
  try {
    f();
  } catch (e) {
    if (e instanceof AppError) return { kind: e.kind, message: e.message, fields: e.fields ?? {} };
    throw e;
  }
  throw new Error("expected a refusal");
}

describe("our CSV formats", () => {
  it("reads a passkey file", () => {
    const r = parseEvidence("passkey", csv("context_length,depth,trials,correct\n32768,0.5,10,9\n32768,1,10,10\n"));
    expect(r).toEqual({
      kind: "passkey",
      rows: [
        { contextLength: 32768, depth: 0.5, trials: 10, correct: 9 },
        { contextLength: 32768, depth: 1, trials: 10, correct: 10 },
      ],
    });
  });
  it("takes columns in any order, a BOM and CRLF line ends", () => {
    const r = parseEvidence("perplexity", csv("\uFEFFperplexity,context_length\r\n7.5,32768\r\n"));
    expect(r.rows).toEqual([{ contextLength: 32768, perplexity: 7.5 }]);
  });
  it("reads ruler and short-regression files", () => {
    expect(parseEvidence("ruler", csv("context_length,task,score\n4096,single,0.9\n")).rows).toHaveLength(1);
    expect(parseEvidence("short_regression", csv("benchmark,baseline,tuned\nreading,0.7,0.69\n")).rows).toEqual([
      { benchmark: "reading", baseline: 0.7, tuned: 0.69 },
    ]);
  });
});

describe("malformed uploads: 400 naming the row and column", () => {
  const cases: [string, () => unknown, RegExp][] = [
    [
      "wrong columns",
      () => parseEvidence("passkey", csv("length,depth,trials,correct\n1,0,1,1\n")),
      /row 1.*missing context_length.*unknown length/,
    ],
    [
      "text in a numeric cell",
      () => parseEvidence("passkey", csv("context_length,depth,trials,correct\n32768,0.5,ten,9\n")),
      /row 2, column trials/,
    ],
    [
      "negative trials",
      () => parseEvidence("needle", csv("context_length,depth,trials,correct\n32768,0.5,-3,0\n")),
      /row 2, column trials/,
    ],
    [
      "correct above trials",
      () => parseEvidence("needle", csv("context_length,depth,trials,correct\n32768,0.5,3,4\n")),
      /row 2, column correct/,
    ],
    [
      "depth outside [0, 1]",
      () => parseEvidence("needle", csv("context_length,depth,trials,correct\n1024,0,1,1\n32768,1.5,3,1\n")),
      /row 3, column depth/,
    ],
    [
      "duplicate rows",
      () => parseEvidence("passkey", csv("context_length,depth,trials,correct\n32768,0.5,3,1\n32768,0.5,3,2\n")),
      /row 3 repeats row 2/,
    ],
    ["an empty file", () => parseEvidence("passkey", csv("")), /empty/],
    ["a header only", () => parseEvidence("passkey", csv("context_length,depth,trials,correct\n")), /no data rows/],
    [
      "a file over the limit",
      () => parseEvidence("passkey", Buffer.alloc(MAX_EVIDENCE_BYTES + 1, 0x31)),
      /larger than/,
    ],
    ["a ragged row", () => parseEvidence("perplexity", csv("context_length,perplexity\n32768\n")), /row 2/],
    [
      "perplexity below 1",
      () => parseEvidence("perplexity", csv("context_length,perplexity\n32768,0.5\n")),
      /row 2, column perplexity/,
    ],
    [
      "a fractional length",
      () => parseEvidence("ruler", csv("context_length,task,score\n4096.5,single,0.9\n")),
      /row 2, column context_length/,
    ],
    [
      "a score above 1",
      () => parseEvidence("ruler", csv("context_length,task,score\n4096,single,91\n")),
      /row 2, column score/,
    ],
    ["a harness JSON without results", () => parseEvidence("ruler", csv('{"config": {}}')), /no "results"/],
    ["broken JSON", () => parseEvidence("ruler", csv('{"results": ')), /not valid JSON/],
  ];
  it.each(cases)("%s", (_name, f, message) => {
    const r = refusal(f);
    expect(r.kind).toBe("invalid");
    expect(r.message).toMatch(message);
    expect(Object.keys(r.fields).length).toBeGreaterThan(0);
  });
});

describe("the evaluation harness's results JSON", () => {
  // Shape of lm-evaluation-harness v0.4 results (lm_eval/tasks/ruler/common_utils.py names metrics by length; -1 = no samples).
  const ruler = {
    results: {
      niah_single_1: {
        alias: "niah_single_1",
        "4096,none": 1.0,
        "4096_stderr,none": "N/A",
        "8192,none": 0.98,
        "16384,none": -1,
      },
      vt: { "4096,none": 0.9, "8192,none": 0.8 },
    },
  };
  it("maps per-length metrics onto ruler rows and drops -1 (no samples)", () => {
    const r = parseEvidence("ruler", Buffer.from(JSON.stringify(ruler)));
    expect(r.rows).toEqual([
      { contextLength: 4096, task: "niah_single_1", score: 1 },
      { contextLength: 8192, task: "niah_single_1", score: 0.98 },
      { contextLength: 4096, task: "vt", score: 0.9 },
      { contextLength: 8192, task: "vt", score: 0.8 },
    ]);
  });
  it("maps a baseline/tuned pair onto short-regression rows by each task's headline metric", () => {
    const pair = {
      baseline: { results: { arc: { "acc,none": 0.5, "acc_norm,none": 0.55, "acc_stderr,none": 0.01 } } },
      tuned: { results: { arc: { "acc,none": 0.49, "acc_norm,none": 0.53 } } },
    };
    expect(parseEvidence("short_regression", Buffer.from(JSON.stringify(pair))).rows).toEqual([
      { benchmark: "arc", baseline: 0.55, tuned: 0.53 },
    ]);
  });
  it("refuses harness JSON for a kind it does not map", () => {
    expect(refusal(() => parseEvidence("passkey", Buffer.from(JSON.stringify(ruler)))).message).toMatch(/CSV format/);
  });
});
