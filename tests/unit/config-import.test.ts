import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import {
  ConfigImportError,
  estimateNonEmbeddingParameters,
  parseModelConfig,
} from "../../server/features/models/config-import";

const fixture = (n: string) => fs.readFileSync(path.join(import.meta.dirname, "../fixtures/configs", n), "utf8");
const codes = (n: string) => parseModelConfig(fixture(n), n).warnings.map((w) => w.code);

describe("config.json import", () => {
  it("reads a published llama3-scaled config: trained length from original_max_position_embeddings", () => {
    // Llama 3.1 8B config (Meta, 2024; values from memory): 8192 trained, factor 8, base 500 000, GQA 32/8.
    const { profile, warnings } = parseModelConfig(fixture("llama31-8b-like.json"));
    expect(profile).toMatchObject({
      headDim: 128,
      ropeTheta: 500000,
      trainedContext: 8192,
      maxPositionEmbeddings: 131072,
      kvHeads: 8,
      layers: 32,
    });
    expect(profile.currentScaling?.method).toBe("llama3");
    expect(profile.currentScaling?.params).toMatchObject({ factor: 8, lowFreqFactor: 1, highFreqFactor: 4 });
    // The published file itself advertises 131072 / 8192 = 16 positions per trained one while its factor is 8:
    // exactly the mismatch the importer must point out.
    const mismatch = warnings.find((w) => w.code === "factor_mismatch");
    expect(mismatch?.message).toContain("= 16");
    // Published non-embedding count is about 6.98 B (from memory: 8.03 B total minus 2 × 128256 × 4096 embeddings).
    expect(profile.parameters! / 1e9).toBeCloseTo(6.98, 1);
  });

  it("a config without scaling uses max_position_embeddings as the trained length", () => {
    const { profile, warnings } = parseModelConfig(fixture("plain-4k.json"));
    expect(profile).toMatchObject({
      name: "heron-1b",
      headDim: 128,
      trainedContext: 4096,
      currentScaling: null,
      bytesPerElement: 2,
    });
    expect(warnings.map((w) => w.code)).toEqual(["parameters_estimated"]);
  });

  it("raises every warning a troubled config deserves, each with a fix", () => {
    const c = codes("every-warning.json");
    for (const code of [
      "missing_original_length",
      "head_dim_differs",
      "partial_rotation",
      "unknown_scaling_key",
      "attention_factor_twice",
      "rope_theta_missing",
    ]) {
      expect(c).toContain(code);
    }
    const { warnings } = parseModelConfig(fixture("every-warning.json"));
    const misspelt = warnings.find((w) => w.code === "unknown_scaling_key")!;
    expect(misspelt.fix).toContain("beta_fast");
    for (const w of warnings) expect(w.fix.length).toBeGreaterThan(10);
    const missing = warnings.find((w) => w.code === "missing_original_length")!;
    expect(missing.fix).toContain("4096"); // 32768 / 8
  });

  it("warns about dynamic scaling with a KV cache, rounded factors and factor switching", () => {
    expect(codes("dynamic.json")).toContain("dynamic_kv_cache");
    expect(codes("rounded-factor.json")).toContain("factor_rounded"); // 32000 / 4096 = 7.8125, factor 8
    const lr = parseModelConfig(fixture("longrope.json"));
    expect(lr.warnings.map((w) => w.code)).toContain("factor_switching");
    expect(lr.profile.currentScaling?.method).toBe("longrope");
    expect((lr.profile.currentScaling?.params.longFactor as number[]).length).toBe(32); // d/2 for head 64
  });

  it("refuses non-JSON and names the keys that are missing", () => {
    expect(() => parseModelConfig(fixture("broken.json"))).toThrow(ConfigImportError);
    try {
      parseModelConfig(fixture("no-heads.json"));
      expect.unreachable();
    } catch (e) {
      expect((e as ConfigImportError).fields).toEqual({
        num_attention_heads: "missing or not a number",
        max_position_embeddings: "missing or not a number",
      });
    }
  });

  it("estimates N = 12·layers·hidden² without intermediate_size (Kaplan et al. 2020, §2.1)", () => {
    expect(estimateNonEmbeddingParameters({ hidden_size: 1024, num_hidden_layers: 8 }, 128, 8, 8)).toBe(
      12 * 8 * 1024 * 1024,
    );
  });
});
