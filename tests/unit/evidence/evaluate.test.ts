import { describe, expect, it } from "vitest";
import { effectiveLength, evaluateCriterion, provenanceShortfall } from "../../../server/engine/evidence/evaluate";
import type { EvidenceCriterion, EvidenceRows } from "../../../server/engine/evidence/rows";

/* Check values below are worked by hand from the definitions in shared/schemas/evidence.ts; the arithmetic is beside each. */
const ctx = { trainedContext: 8192, parity: null };
const crit = (c: Partial<EvidenceCriterion> & Pick<EvidenceCriterion, "kind">): EvidenceCriterion => ({
  contextLength: 32768,
  comparison: ">=",
  threshold: 0.9,
  ...c,
});

describe("passkey: Σ correct ÷ Σ trials at the criterion's length", () => {
  const ev: EvidenceRows = {
    kind: "passkey",
    rows: [
      { contextLength: 32768, depth: 0, trials: 10, correct: 10 },
      { contextLength: 32768, depth: 0.5, trials: 10, correct: 8 },
      { contextLength: 32768, depth: 1, trials: 20, correct: 19 },
      { contextLength: 16384, depth: 0.5, trials: 10, correct: 0 }, // another length: ignored
    ],
  };
  it("pools the depths at that length: (10 + 8 + 19) ÷ (10 + 10 + 20) = 37/40 = 0.925 ≥ 0.9 → pass", () => {
    const r = evaluateCriterion(crit({ kind: "passkey" }), [ev], ctx);
    expect(r.status).toBe("pass");
    expect(r.observed).toBeCloseTo(0.925, 15);
  });
  it("the same evidence fails a 0.95 threshold (0.925 < 0.95)", () => {
    expect(evaluateCriterion(crit({ kind: "passkey", threshold: 0.95 }), [ev], ctx).status).toBe("fail");
  });
  it("no rows at the length → no_data", () => {
    expect(evaluateCriterion(crit({ kind: "passkey", contextLength: 65536 }), [ev], ctx).status).toBe("no_data");
  });
  it("no evidence of the kind → no_data", () => {
    expect(evaluateCriterion(crit({ kind: "passkey" }), [], ctx).status).toBe("no_data");
  });
});

describe("needle: min or mean of cell recalls up to the criterion's length", () => {
  const ev: EvidenceRows = {
    kind: "needle",
    rows: [
      { contextLength: 16384, depth: 0, trials: 4, correct: 4 }, // 1
      { contextLength: 16384, depth: 1, trials: 4, correct: 3 }, // 0.75
      { contextLength: 32768, depth: 0, trials: 4, correct: 4 }, // 1
      { contextLength: 32768, depth: 1, trials: 4, correct: 4 }, // 1
      { contextLength: 65536, depth: 0, trials: 4, correct: 0 }, // beyond the criterion: ignored
    ],
  };
  it("min = 0.75 (the 16k, depth 1 cell) < 0.9 → fail", () => {
    const r = evaluateCriterion(crit({ kind: "needle", aggregate: "min" }), [ev], ctx);
    expect([r.status, r.observed]).toEqual(["fail", 0.75]);
  });
  it("mean = (1 + 0.75 + 1 + 1) ÷ 4 = 0.9375 ≥ 0.9 → pass", () => {
    const r = evaluateCriterion(crit({ kind: "needle", aggregate: "mean" }), [ev], ctx);
    expect(r.status).toBe("pass");
    expect(r.observed).toBeCloseTo(0.9375, 15);
  });
});

describe("ruler: mean task score at a length, and the effective length", () => {
  // mean per length: 4k (0.95 + 0.91)/2 = 0.93; 8k (0.9 + 0.88)/2 = 0.89; 16k (0.8 + 0.7)/2 = 0.75; 32k 0.86 (one task)
  const rows = [
    { contextLength: 4096, task: "single", score: 0.95 },
    { contextLength: 4096, task: "multi", score: 0.91 },
    { contextLength: 8192, task: "single", score: 0.9 },
    { contextLength: 8192, task: "multi", score: 0.88 },
    { contextLength: 16384, task: "single", score: 0.8 },
    { contextLength: 16384, task: "multi", score: 0.7 },
    { contextLength: 32768, task: "single", score: 0.86 },
  ];
  it("effective length at 0.85 is 8192: 0.93 and 0.89 pass, 0.75 at 16k stops it; 32k's 0.86 does not count", () => {
    expect(effectiveLength(rows, 0.85)).toBe(8192);
  });
  it("effective length at 0.95 is null: the 4k mean 0.93 already misses", () => {
    expect(effectiveLength(rows, 0.95)).toBeNull();
  });
  it("criterion at 16384 with threshold 0.85: observed 0.75 → fail, effective length 8192 reported", () => {
    const r = evaluateCriterion(
      crit({ kind: "ruler", contextLength: 16384, threshold: 0.85 }),
      [{ kind: "ruler", rows }],
      ctx,
    );
    expect(r.status).toBe("fail");
    expect(r.observed).toBeCloseTo(0.75, 15);
    expect(r.effectiveLength).toBe(8192);
  });
});

describe("perplexity: at a length, or as a ratio to the trained length", () => {
  const ev: EvidenceRows = {
    kind: "perplexity",
    rows: [
      { contextLength: 8192, perplexity: 6.4 },
      { contextLength: 32768, perplexity: 7.2 },
    ],
  };
  it("perplexity 7.2 ≤ 8 → pass", () => {
    const r = evaluateCriterion(crit({ kind: "perplexity", comparison: "<=", threshold: 8 }), [ev], ctx);
    expect([r.status, r.observed]).toEqual(["pass", 7.2]);
  });
  it("ratio 7.2 ÷ 6.4 = 1.125 > 1.1 → fail", () => {
    const r = evaluateCriterion(
      crit({ kind: "perplexity", measure: "ratio", comparison: "<=", threshold: 1.1 }),
      [ev],
      ctx,
    );
    expect(r.status).toBe("fail");
    expect(r.observed).toBeCloseTo(1.125, 15);
    expect(r.trainedPerplexity).toBe(6.4);
  });
  it("a ratio without a trained-length row → no_data", () => {
    const r = evaluateCriterion(
      crit({ kind: "perplexity", measure: "ratio", comparison: "<=", threshold: 1.1 }),
      [ev],
      {
        ...ctx,
        trainedContext: 4096,
      },
    );
    expect(r.status).toBe("no_data");
  });
});

describe("short_regression: the largest loss on the named benchmarks stays ≤ δ", () => {
  const ev: EvidenceRows = {
    kind: "short_regression",
    rows: [
      { benchmark: "reading", baseline: 0.71, tuned: 0.7 }, // loss 0.01
      { benchmark: "arith", baseline: 0.55, tuned: 0.52 }, // loss 0.03
      { benchmark: "trivia", baseline: 0.6, tuned: 0.61 }, // gain: loss −0.01
    ],
  };
  it("named reading and trivia: max(0.01, −0.01) = 0.01 ≤ 0.02 → pass", () => {
    const r = evaluateCriterion(
      crit({ kind: "short_regression", comparison: "<=", threshold: 0.02, benchmarks: ["reading", "trivia"] }),
      [ev],
      ctx,
    );
    expect(r.status).toBe("pass");
    expect(r.observed).toBeCloseTo(0.01, 12);
  });
  it("all benchmarks: max loss 0.03 > 0.02 → fail, even if the stored comparison was >=", () => {
    const r = evaluateCriterion(crit({ kind: "short_regression", comparison: ">=", threshold: 0.02 }), [ev], ctx);
    expect(r.status).toBe("fail");
    expect(r.observed).toBeCloseTo(0.03, 12);
  });
  it("a named benchmark with no scores → no_data", () => {
    const r = evaluateCriterion(crit({ kind: "short_regression", threshold: 0.02, benchmarks: ["coding"] }), [ev], ctx);
    expect(r.status).toBe("no_data");
  });
});

describe("parity: the latest probe check", () => {
  const c = crit({ kind: "parity" });
  it("no check → no_data; a passing check → pass with its worst error", () => {
    expect(evaluateCriterion(c, [], ctx).status).toBe("no_data");
    const r = evaluateCriterion(c, [], { ...ctx, parity: { passed: true, maxRelativeError: 3e-8 } });
    expect([r.status, r.observed]).toEqual(["pass", 3e-8]);
  });
  it("a failing check → fail", () => {
    expect(evaluateCriterion(c, [], { ...ctx, parity: { passed: false, maxRelativeError: 0.2 } }).status).toBe("fail");
  });
});

describe("provenance shortfall (5% tolerance, stated convention)", () => {
  const buckets = [{ contextLength: 32768, meanTokens: 32500, minTokens: 31200 }];
  it("31 200 ≥ 0.95 × 32 768 = 31 129.6 → sufficient", () => {
    expect(provenanceShortfall(32768, buckets)).toBeNull();
  });
  it("a bucket whose shortest input had 24 000 tokens → insufficient, with the counts in the reason", () => {
    expect(provenanceShortfall(32768, [{ contextLength: 32768, meanTokens: 30000, minTokens: 24000 }])).toMatch(
      /24000/,
    );
  });
  it("no bucket for the length → insufficient", () => {
    expect(provenanceShortfall(65536, buckets)).toMatch(/no token counts/);
  });
});
