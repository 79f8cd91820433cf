import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import type { MethodParams } from "../../../../shared/schemas/analysis";
import { TARGETS, exportForTargets } from "../../../../server/engine/targets";
import { planInput } from "./helpers";

/*
 * llama.cpp and multimodal sections (ggml-org/llama.cpp):
 * - convert_hf_to_gguf.py (TextModel.set_gguf_parameters, a458664 and later) writes mrope_section padded to four
 *   entries as `<arch>.rope.dimension_sections`;
 * - src/llama-model.cpp llama_model_rope_type fixes the layout by architecture: qwen2vl contiguous (MROPE), qwen3vl and
 *   qwen3vlmoe interleaved (IMROPE); other architectures rotate on one axis;
 * - ggml/src/ggml-cpu/ops.cpp (0049e3c) ggml_mrope_cache_init turns every pair with the same rope_yarn (freq_scale,
 *   ext_factor, ramp ends from n_ctx_orig, attention factor) as the one-axis rope, so scaling applies alike.
 */
const QWEN2VL_LIKE = {
  model_type: "qwen2_vl",
  hidden_size: 3584,
  num_attention_heads: 28,
  num_key_value_heads: 4,
  max_position_embeddings: 32768,
  rope_theta: 1000000.0,
  rope_scaling: { type: "mrope", mrope_section: [16, 24, 24] },
};
const SHAPE = { d: 128, base: 1e6, trained: 32768, target: 131072 };
const METHODS: MethodParams[] = [{ method: "yarn" }, { method: "linear", factor: 4 }, { method: "ntk" }];

describe("llama.cpp: sections go into the metadata; scaling applies to the sectioned rope as to a plain one", () => {
  for (const method of METHODS) {
    it(`qwen2vl (contiguous) × ${method.method}: the sections padded to four, read back as the plan`, () => {
      const [out] = exportForTargets(planInput(QWEN2VL_LIKE, method, SHAPE), ["llama-cpp"]);
      expect(out.conformance.status, out.conformance.cause).not.toBe("unsupported");
      expect(out.conformance.status, out.conformance.cause).not.toBe("differs");
      const metadata = out.artifact!.content.metadata as Record<string, unknown>;
      expect(metadata["qwen2vl.rope.dimension_sections"]).toEqual([16, 24, 24, 0]);
      // 16 + 24 + 24 = 64 = d/2: every pair is turned, through the same formula as a model without sections
      const plain = { ...QWEN2VL_LIKE, model_type: "qwen2", rope_scaling: null };
      const [flat] = exportForTargets(planInput(plain, method, SHAPE), ["llama-cpp"]);
      expect(out.readBack!.invFreq).toEqual(flat.readBack!.invFreq);
      expect(out.readBack!.attentionFactor).toBe(flat.readBack!.attentionFactor);
    });
  }

  it("qwen3vl with interleaved sections: accepted, the layout matches the architecture's", () => {
    const cfg = {
      ...QWEN2VL_LIKE,
      model_type: "qwen3_vl",
      rope_scaling: { rope_type: "default", mrope_section: [24, 20, 20], mrope_interleaved: true },
    };
    const [out] = exportForTargets(planInput(cfg, { method: "yarn" }, SHAPE), ["llama-cpp"]);
    expect(out.conformance.status, out.conformance.cause).not.toBe("unsupported");
    expect((out.artifact!.content.metadata as Record<string, unknown>)["qwen3vl.rope.dimension_sections"]).toEqual([
      24, 20, 20, 0,
    ]);
  });

  it("qwen2vl with an interleaved flag: refused, llama.cpp runs contiguous sections for that architecture", () => {
    const cfg = { ...QWEN2VL_LIKE, rope_scaling: { ...QWEN2VL_LIKE.rope_scaling, mrope_interleaved: true } };
    const [out] = exportForTargets(planInput(cfg, { method: "yarn" }, SHAPE), ["llama-cpp"]);
    expect(out.conformance.status).toBe("unsupported");
    expect(out.conformance.cause).toContain("qwen2vl runs contiguous sections");
    expect(out.conformance.workaround).toContain("vLLM or SGLang");
  });

  it("an architecture without a multi-section rope (the hand-written fixture's model_type): refused", () => {
    const cfg = JSON.parse(
      fs.readFileSync(
        path.join(import.meta.dirname, "../../../fixtures/configs/mrope-sections-contiguous.json"),
        "utf8",
      ),
    ) as Record<string, unknown>;
    const [out] = exportForTargets(planInput(cfg, { method: "yarn" }, SHAPE), ["llama-cpp"]);
    expect(out.conformance.status).toBe("unsupported");
    expect(out.conformance.cause).toContain("converts as sections_test, which turns every pair by one position axis");
    // the fallback artifact still carries the sections the converter would write
    expect(
      (out.artifact!.content.metadata as Record<string, unknown>)["sections_test.rope.dimension_sections"],
    ).toEqual([16, 24, 24, 0]);
  });

  it("the reader takes the sections from the converted file without changing θ′", () => {
    const [out] = exportForTargets(planInput(QWEN2VL_LIKE, { method: "yarn" }, SHAPE), ["llama-cpp"]);
    const r = TARGETS["llama-cpp"].read(QWEN2VL_LIKE, out.artifact!);
    expect(r.invFreq).toHaveLength(64);
    expect(r.method).toBe("yarn");
  });
});
