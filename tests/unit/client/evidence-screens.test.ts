import { describe, expect, it } from "vitest";
import type { CriterionVerdict, Evidence } from "../../../shared/schemas/evidence-api";
import {
  benchmarkPairs,
  columnPosition,
  perplexityPoints,
  retrievalGrid,
  taskSeries,
} from "../../../client/src/features/evidence/lib/chart-data";
import { uploadProblems } from "../../../client/src/features/evidence/lib/upload-problems";
import { formatFigure, observedAgainstThreshold } from "../../../client/src/features/evidence/lib/units";
import { uploadFormSchema } from "../../../client/src/features/evidence/lib/upload-form-schema";
import { provenanceTemplate } from "../../../client/src/features/evidence/lib/provenance-template";

const upload = (id: number, kind: Evidence["kind"], rows: Evidence["rows"]): Evidence => ({
  id,
  revision: 1,
  kind,
  fileName: `${kind}.csv`,
  format: "csv",
  checksum: "0".repeat(64),
  bytes: 1,
  rows,
  fingerprint: "0".repeat(64),
  provenance: {
    engine: "e",
    engineVersion: "1",
    tokenizer: "t",
    chatTemplate: "none",
    truncation: "left",
    generationBudget: 1,
    buckets: [],
  },
  by: { id: 1, name: "x" },
  via: "session",
  at: "2026-01-01T00:00:00.000Z",
});

describe("evidence charts: the figures drawn are the figures the verdict reads", () => {
  it("heatmap cells merge uploads: Σ correct ÷ Σ trials per length × depth cell", () => {
    // Worked by hand: cell (32768, 0.5) gets 9 of 10 from one upload and 3 of 10 from another → 12 / 20 = 0.6.
    const grid = retrievalGrid(
      [
        upload(1, "passkey", [
          { contextLength: 32768, depth: 0.5, trials: 10, correct: 9 },
          { contextLength: 4096, depth: 0, trials: 4, correct: 4 },
        ]),
        upload(2, "passkey", [{ contextLength: 32768, depth: 0.5, trials: 10, correct: 3 }]),
        upload(3, "needle", [{ contextLength: 65536, depth: 1, trials: 1, correct: 0 }]),
      ],
      "passkey",
    );
    expect(grid.lengths).toEqual([4096, 32768]);
    expect(grid.depths).toEqual([0, 0.5]);
    expect(grid.cells.find((c) => c.length === 32768)).toMatchObject({ trials: 20, correct: 12, rate: 0.6 });
  });

  it("task means per length; perplexity and benchmark rows in order", () => {
    // mean at 4096 = (0.95 + 0.85) / 2 = 0.9; at 32768 = (0.8 + 0.6) / 2 = 0.7
    const { tasks, mean } = taskSeries([
      upload(1, "ruler", [
        { contextLength: 32768, task: "vt", score: 0.6 },
        { contextLength: 4096, task: "niah", score: 0.95 },
        { contextLength: 4096, task: "vt", score: 0.85 },
        { contextLength: 32768, task: "niah", score: 0.8 },
      ]),
    ]);
    expect(tasks.map((t) => t.task)).toEqual(["niah", "vt"]);
    expect(mean.map((p) => p.x)).toEqual([4096, 32768]);
    expect(mean[0]!.y).toBeCloseTo(0.9, 12);
    expect(mean[1]!.y).toBeCloseTo(0.7, 12);
    expect(
      perplexityPoints([
        upload(1, "perplexity", [
          { contextLength: 32768, perplexity: 8.4 },
          { contextLength: 4096, perplexity: 8 },
        ]),
      ]),
    ).toEqual([
      { x: 4096, y: 8 },
      { x: 32768, y: 8.4 },
    ]);
    expect(
      benchmarkPairs([upload(1, "short_regression", [{ benchmark: "mmlu", baseline: 0.62, tuned: 0.61 }])]),
    ).toEqual([{ benchmark: "mmlu", baseline: 0.62, tuned: 0.61 }]);
  });

  it("a length between two measured columns sits where log-interpolation puts it", () => {
    // Columns at 4096, 16384, 65536 with centres 0, 100, 200: 32768 is half-way between 16384 and 65536 in log2
    // (15 is half-way from 14 to 16), so 150; a measured length is its column's centre; outside, half a step past.
    const centre = (i: number) => i * 100;
    expect(columnPosition(32768, [4096, 16384, 65536], centre, 100)).toBeCloseTo(150, 9);
    expect(columnPosition(16384, [4096, 16384, 65536], centre, 100)).toBe(100);
    expect(columnPosition(131072, [4096, 16384, 65536], centre, 100)).toBe(250);
    expect(columnPosition(1024, [4096, 16384, 65536], centre, 100)).toBe(-50);
  });
});

describe("evidence screens: words", () => {
  it("a refused upload becomes sentences naming row and column", () => {
    expect(
      uploadProblems({
        status: 400,
        code: "invalid",
        message: 'row 2, column trials: "ten" is not a number',
        fields: { "row 2, column trials": '"ten" is not a number' },
      }),
    ).toEqual(['Row 2, column trials: "ten" is not a number.']);
    expect(
      uploadProblems({
        status: 400,
        code: "invalid",
        message: "row 1: a passkey file has the columns context_length,depth,trials,correct; missing context_length",
        fields: {
          "row 1": "a passkey file has the columns context_length,depth,trials,correct; missing context_length",
        },
      }),
    ).toEqual([
      "Row 1 (the header): A passkey file has the columns context_length,depth,trials,correct; missing context_length.",
    ]);
    expect(
      uploadProblems({
        status: 400,
        code: "too_large",
        message: "the uploaded file is larger than 5 MB",
        fields: { file: "larger than 5 MB" },
      }),
    ).toEqual(["The file is larger than 5 MB."]);
    expect(
      uploadProblems({
        status: 400,
        code: "invalid",
        message: "the file is empty",
        fields: { file: "the file is empty" },
      }),
    ).toEqual(["The file is empty."]);
    // a schema check's own sentence (shared/validation-messages.ts) is kept whole
    expect(
      uploadProblems({
        status: 400,
        code: "invalid",
        message: "Engine is required.",
        fields: { "provenance.engine": "Engine is required." },
      }),
    ).toEqual(["In the provenance: Engine is required."]);
  });

  it("figures carry their units", () => {
    expect(formatFigure("passkey", 0.95)).toBe("0.950 (95.0 %)");
    expect(formatFigure("perplexity", 1.05, { measure: "ratio" })).toBe("1.050 × trained-length perplexity");
    expect(formatFigure("parity", 3.2e-7)).toBe("3.20e-7 relative error");
    const v = { kind: "passkey", comparison: ">=", threshold: 0.9, observed: null } as CriterionVerdict;
    expect(observedAgainstThreshold(v)).toBe("no figure yet; must be ≥ 0.900 (90.0 %)");
  });

  it("the upload form refuses an unedited provenance template with a sentence naming the key", () => {
    const r = uploadFormSchema.safeParse({
      kind: "passkey",
      fingerprint: "a".repeat(64),
      provenance: provenanceTemplate([4096, 32768]),
      file: undefined,
    });
    expect(r.success).toBe(false);
    const messages = r.error!.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
    expect(messages).toContain("provenance: In the provenance, engine is empty.");
    expect(messages).toContain("file: Choose the results file to upload.");
    const notJson = uploadFormSchema.safeParse({ kind: "passkey", fingerprint: "A", provenance: "engine=x" });
    expect(notJson.error!.issues.map((i) => i.message)).toEqual(
      expect.arrayContaining([
        "The fingerprint is 64 lowercase hexadecimal characters: the revision's, shown above.",
        "The provenance is not valid JSON; start again from the template.",
      ]),
    );
  });
});
