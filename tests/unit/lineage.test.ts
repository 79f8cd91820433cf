import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { parseModelConfig } from "../../server/features/models/config-import";
import { runMethod } from "../../server/engine/methods";
import { chainedMethod, shippedMethod } from "../../shared/lineage";
import { importPreviewProfileSchema } from "../../shared/schemas";

/*
 * Lineage (issue 11): a model whose config already ships scaling. Expected lengths follow the loaders cited in
 * server/features/models/lineage-lengths.ts; the frequencies follow huggingface/transformers' yarn initialiser.
 */
const fixture = (n: string) => fs.readFileSync(path.join(import.meta.dirname, "../fixtures/configs", n), "utf8");
const parse = (n: string) => parseModelConfig(fixture(n), n);

describe("the two lengths of an already-scaled model", () => {
  it("yarn with original_max_position_embeddings: pre-trained 8192 (the block's value), served 32768 (max_position_embeddings)", () => {
    const { profile } = parse("already-scaled-yarn.json");
    expect(profile).toMatchObject({ trainedContext: 8192, pretrainedContext: 8192, servedContext: 32768 });
    expect(importPreviewProfileSchema.safeParse(profile).success).toBe(true);
  });

  it("linear without an original length: loaders read max_position_embeddings 4096 as pre-trained; served 4096 × 4", () => {
    // transformers' linear initialiser reads no length; vLLM's _get_and_verify_max_len multiplies by the factor.
    const { profile, warnings } = parse("already-scaled-linear-no-original.json");
    expect(profile).toMatchObject({ trainedContext: 4096, pretrainedContext: 4096, servedContext: 16384 });
    expect(warnings.map((w) => w.code)).toContain("missing_original_length");
  });

  it("llama3 as published: pre-trained 8192, served 131072", () => {
    const { profile } = parse("llama31-8b-like.json");
    expect(profile).toMatchObject({ pretrainedContext: 8192, servedContext: 131072 });
  });

  it("an unscaled model is served at its trained length", () => {
    const { profile } = parse("plain-4k.json");
    expect(profile).toMatchObject({ pretrainedContext: 4096, servedContext: 4096, currentScaling: null });
  });
});

/**
 * The yarn initialiser of huggingface/transformers (src/transformers/modeling_rope_utils.py, `_compute_yarn_parameters`,
 * v4.5x line), restated independently of our engine: correction dimension d·ln(L/(β·2π)) / (2 ln b), low floored and
 * high ceiled (truncate), a linear ramp between them, extrapolated frequencies below low, interpolated (÷ factor) above.
 */
function consumerYarn(d: number, base: number, L: number, factor: number, betaFast: number, betaSlow: number) {
  const corr = (beta: number) => (d * Math.log(L / (beta * 2 * Math.PI))) / (2 * Math.log(base));
  const low = Math.max(Math.floor(corr(betaFast)), 0);
  const high = Math.min(Math.ceil(corr(betaSlow)), d - 1);
  const out: number[] = [];
  for (let i = 0; i < d / 2; i++) {
    const extrap = 1 / Math.pow(base, (2 * i) / d);
    const ramp = Math.min(1, Math.max(0, (i - low) / (high === low ? high - low + 0.001 : high - low)));
    const keep = 1 - ramp;
    out.push((extrap / factor) * (1 - keep) + extrap * keep);
  }
  return out;
}

describe("as shipped", () => {
  const { profile } = parse("already-scaled-yarn.json");
  const shipped = shippedMethod(profile.currentScaling)!;
  const ctx = { d: 128, base: 500_000, trainedContext: 8192, targetContext: 32768 };

  it("reads the config's block as a method the engine runs", () => {
    expect(shipped).toEqual({ method: "yarn", factor: 4, betaFast: 32, betaSlow: 1 });
  });

  it("gives the inverse frequencies the config's loader computes today", () => {
    const ours = Array.from(runMethod(ctx, shipped).invFreq);
    const theirs = consumerYarn(128, 500_000, 8192, 4, 32, 1);
    ours.forEach((x, i) => expect(x).toBeCloseTo(theirs[i], 15));
  });

  it("matches check values worked by hand", () => {
    // corr(32) = 128·ln(8192/(32·2π)) / (2·ln 500000) = 128·3.70731/26.24472 = 18.08 → low 18;
    // corr(1) = 128·ln(8192/2π) / 26.24472 = 128·7.17303/26.24472 = 34.98 → high 35.
    const inv = runMethod(ctx, shipped).invFreq;
    const theta = (i: number) => Math.pow(500_000, -(2 * i) / 128);
    expect(inv[0]).toBe(1); // below low: kept
    expect(inv[17]).toBeCloseTo(theta(17), 15); // still kept
    expect(inv[35]).toBeCloseTo(theta(35) / 4, 15); // from high on: divided by the factor
    // pair 26: ramp (26 − 18)/(35 − 18) = 8/17, so θ·(8/17)/4 + θ·(9/17) = θ·(2/17 + 9/17) = θ·11/17
    expect(inv[26]).toBeCloseTo((theta(26) * 11) / 17, 15);
    // attention factor 0.1·ln 4 + 1 = 1.1386294 (YaRN, Peng et al. 2023, eq. 22; from memory)
    expect(runMethod(ctx, shipped).attentionFactor).toBeCloseTo(1.1386294, 6);
  });

  it("a misspelt or foreign key of the block is left out instead of refusing the whole method", () => {
    expect(shippedMethod({ method: "yarn", params: { factor: 4, betaFats: 3 }, raw: {} })).toEqual({
      method: "yarn",
      factor: 4,
    });
    expect(shippedMethod({ method: "mystery", params: { factor: 2 }, raw: {} })).toBeNull();
    expect(shippedMethod(null)).toBeNull();
  });
});

describe("a plan that extends from the served length", () => {
  const lineage = { pretrainedContext: 8192, servedContext: 32768 };
  it("exports ×4 on top of a shipped ×4 as ×16 over the pre-trained length", () => {
    expect(chainedMethod({ method: "yarn", factor: 4 }, lineage, "served")).toEqual({ method: "yarn", factor: 16 });
    expect(chainedMethod({ method: "linear", factor: 2 }, lineage, "served")).toEqual({ method: "linear", factor: 8 });
  });
  it("leaves plans from the pre-trained length, empty factors and factor-free methods as they are", () => {
    expect(chainedMethod({ method: "yarn", factor: 4 }, lineage, "pretrained")).toEqual({ method: "yarn", factor: 4 });
    expect(chainedMethod({ method: "yarn" }, lineage, "served")).toEqual({ method: "yarn" });
    expect(chainedMethod({ method: "base", base: 1e6 }, lineage, "served")).toEqual({ method: "base", base: 1e6 });
  });
});
