import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { ConfigImportError, parseModelConfig } from "../../server/features/models/config-import";
import { importPreviewProfileSchema } from "../../shared/schemas";

/*
 * Hand-written configs, one per layout (tests/fixtures/configs). Each expected value names the loader behaviour it
 * follows (huggingface/transformers; the same citations sit beside the code in server/features/models/*).
 */
const fixture = (n: string) => fs.readFileSync(path.join(import.meta.dirname, "../fixtures/configs", n), "utf8");
const parse = (n: string) => parseModelConfig(fixture(n), n);
const codes = (n: string) => parse(n).warnings.map((w) => w.code);
const warning = (n: string, code: string) => parse(n).warnings.find((w) => w.code === code);

describe("latent attention", () => {
  it("rotates qk_rope_head_dim (64), not hidden / heads (7168 / 128 = 56), and caches 512 + 64 per token", () => {
    // DeepseekV3Config sets head_dim = qk_rope_head_dim; kv_a_proj_with_mqa outputs kv_lora_rank + qk_rope_head_dim.
    const { profile } = parse("latent-attention-yarn.json");
    expect(profile).toMatchObject({ rotaryDim: 64, headDim: 64, partialRotaryFactor: 1, kvLatentDim: 576 });
    expect(profile.trainedContext).toBe(4096);
    expect(importPreviewProfileSchema.safeParse(profile).success).toBe(true);
  });

  it("says the YaRN temperature goes into the softmax scale, squared, instead of claiming it cancels", () => {
    const c = codes("latent-attention-yarn.json");
    expect(c).toContain("softmax_temperature");
    expect(c).not.toContain("attention_factor_cancels");
    // mscale(40, 1) = 0.1·ln 40 + 1 = 1.368888 (YaRN's formula); squared 1.873854 (arithmetic).
    expect(warning("latent-attention-yarn.json", "softmax_temperature")!.message).toContain("1.8739");
  });
});

describe("per-layer-type settings", () => {
  for (const file of ["sliding-full-local-base.json", "sliding-pattern-local-base.json"]) {
    it(`${file}: local layers keep their own base, unscaled; full layers carry the scaling`, () => {
      const { profile } = parse(file);
      const [local, full] = profile.layerGroups!;
      expect(local).toEqual({
        kind: "sliding_attention",
        layers: [0, 1, 2, 3, 4, 6, 7, 8, 9, 10],
        ropeTheta: 10_000,
        rotaryDim: 256,
        slidingWindow: 1024,
        currentScaling: null,
      });
      expect(full).toMatchObject({ kind: "full_attention", layers: [5, 11], ropeTheta: 1e6, slidingWindow: null });
      expect(full.currentScaling).toMatchObject({ method: "linear", params: { factor: 8 } });
      // The top-level fields describe the group scaling applies to.
      expect(profile).toMatchObject({ ropeTheta: 1e6, trainedContext: 16384, rotaryDim: 256 });
    });
  }

  it("reads rope_parameters nested by layer type (standardize_rope_params, case 2)", () => {
    const { profile, warnings } = parse("nested-rope-parameters.json");
    expect(profile).toMatchObject({ ropeTheta: 1e6, trainedContext: 32768 });
    expect(profile.currentScaling).toMatchObject({ method: "yarn", params: { factor: 4 } });
    const local = profile.layerGroups!.find((g) => g.kind === "sliding_attention")!;
    expect(local).toMatchObject({
      layers: [0, 1, 2, 4, 5, 6],
      ropeTheta: 10_000,
      slidingWindow: 4096,
      currentScaling: null,
    });
    expect(warnings.map((w) => w.code)).not.toContain("unknown_scaling_key");
  });

  it("a model without layer types is one full_attention group over every layer", () => {
    const { profile } = parse("plain-4k.json");
    expect(profile.layerGroups).toHaveLength(1);
    expect(profile.layerGroups![0]).toMatchObject({
      kind: "full_attention",
      slidingWindow: null,
      currentScaling: null,
    });
    expect(profile.layerGroups![0].layers).toHaveLength(profile.layers!);
  });

  it("layers with no position encoding form a no_rope group that is never scaled", () => {
    // no_rope_layers: 1 = the layer rotates, 0 = no position encoding (SmolLM3Attention.use_rope).
    const { profile } = parse("mixed-rope-nope.json");
    expect(profile.layerGroups).toEqual([
      expect.objectContaining({ kind: "full_attention", layers: [0, 1, 2, 4, 5, 6], ropeTheta: 5e6 }),
      { kind: "no_rope", layers: [3, 7], ropeTheta: null, rotaryDim: 0, slidingWindow: null, currentScaling: null },
    ]);
  });
});

describe("conflicting values", () => {
  it("original_max_position_embeddings: the top-level 4096 wins over the block's 2048, as loaders read it", () => {
    const { profile } = parse("conflict-original-length.json");
    expect(profile.trainedContext).toBe(4096);
    expect(warning("conflict-original-length.json", "original_length_conflict")!.message).toMatch(/4096.*2048/);
    // 32768 / 4096 = 8 = factor: no mismatch once the right length is read.
    expect(codes("conflict-original-length.json")).not.toContain("factor_mismatch");
  });

  it("rope_theta: the rope_parameters value (500 000) wins over the top-level 10 000 and the warning names it", () => {
    const { profile } = parse("conflict-base.json");
    expect(profile.ropeTheta).toBe(500_000);
    expect(warning("conflict-base.json", "base_conflict")!.message).toContain("the base is 500000");
  });
});

describe("legacy names", () => {
  it('type "su" still reads as per-pair factors, with the current name given', () => {
    const { profile } = parse("legacy-type-su.json");
    expect(profile.currentScaling?.method).toBe("longrope");
    expect(warning("legacy-type-su.json", "legacy_type_name")!.message).toContain('"longrope"');
  });

  it("rotary_emb_base and rotary_pct give the base (1e6, not 10 000) and the rotating fraction", () => {
    // GPTNeoXConfig: rope_theta = rotary_emb_base, partial_rotary_factor = rotary_pct; 2560 / 32 = 80, 80 × 0.25 = 20.
    const { profile } = parse("neox-style-keys.json");
    expect(profile).toMatchObject({ ropeTheta: 1e6, headDim: 80, partialRotaryFactor: 0.25, rotaryDim: 20 });
    expect(codes("neox-style-keys.json")).not.toContain("rope_theta_missing");
  });
});

describe("multimodal sections", () => {
  it("contiguous sections under the older name mrope: read, summed against rotaryDim / 2 = 64", () => {
    const { profile } = parse("mrope-sections-contiguous.json");
    expect(profile).toMatchObject({ mropeSection: [16, 24, 24], mropeInterleaved: false, rotaryDim: 128 });
    const c = codes("mrope-sections-contiguous.json");
    expect(c).toContain("legacy_type_name");
    expect(c).not.toContain("mrope_section_sum");
    expect(c).not.toContain("unknown_scaling_key");
  });

  it("interleaved sections that add up to 60 of 64 pairs are flagged", () => {
    const { profile } = parse("mrope-sections-interleaved-bad-sum.json");
    expect(profile).toMatchObject({ mropeSection: [24, 20, 16], mropeInterleaved: true });
    expect(warning("mrope-sections-interleaved-bad-sum.json", "mrope_section_sum")!.message).toContain("60");
  });
});

describe("models whose positions are not rotary", () => {
  const cases: [string, RegExp, string][] = [
    ["learned-absolute.json", /learned absolute/, "position_embedding_type"],
    ["learned-absolute-n-positions.json", /learned absolute/, "n_positions"],
    ["sinusoidal-table.json", /sinusoidal/, "sinusoidal_pos_embds"],
    ["alibi-bias.json", /ALiBi/, "alibi"],
    ["no-position.json", /no position encoding/, "no_rope_layers"],
  ];
  for (const [file, scheme, key] of cases) {
    it(`${file} is refused as not_rotary, naming the scheme`, () => {
      try {
        parse(file);
        expect.unreachable();
      } catch (e) {
        expect(e).toBeInstanceOf(ConfigImportError);
        const err = e as ConfigImportError;
        expect(err.code).toBe("not_rotary");
        expect(err.message).toMatch(scheme);
        expect(err.message).toMatch(/no frequencies to rescale/);
        expect(Object.keys(err.fields)).toEqual([key]);
      }
    });
  }
});

describe("a file claiming an absurd layer count", () => {
  it("previews without listing two billion layers (no groups; saving refuses the count)", () => {
    const text = JSON.stringify({
      hidden_size: 1024,
      num_attention_heads: 8,
      num_hidden_layers: 2 ** 31 - 1,
      max_position_embeddings: 4096,
    });
    const { profile } = parseModelConfig(text);
    expect(profile.layerGroups).toBeUndefined();
  });
});
