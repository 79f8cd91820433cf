import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import {
  TARGET_IDS,
  exportPlan,
  stacksKeepingSections,
  SECTIONS_WITH_ARTIFACT,
} from "../../../../server/engine/targets";
import type { MethodParams } from "../../../../shared/schemas/analysis";
import { frozenBlockCautions } from "../../../../shared/frozen-block";

/*
 * Which stacks' rigging keeps a model's multimodal sections (the ways out the signed-block caution names) comes from
 * the targets themselves: each target's compile for this model and plan, and where its consumer holds the sections once
 * the artifact is applied (server/engine/targets/registry.ts SECTIONS_WITH_ARTIFACT). The expected lists are facts of
 * the consumers, each cited where the target encodes it:
 * - every transformers line runs every method on a model with sections (the merge patch keeps them);
 * - vLLM and SGLang build a multimodal rotary only for rope_type default or yarn (get_rope: vllm
 *   rotary_embedding/__init__.py at 07b12f1, sglang mrope.py at 020d83a; engines/multimodal-types.ts), so a linear or
 *   dynamic plan is refused there;
 * - llama.cpp runs sections only for qwen2vl (contiguous) and qwen3vl / qwen3vlmoe (interleaved), fixed by
 *   llama_model_rope_type (llama-cpp.ts, commit 25f1910), and takes no dynamic scaling from a flag.
 * The contiguous hand-written fixture, under three model types.
 */
const fixture = JSON.parse(
  fs.readFileSync(path.join(import.meta.dirname, "../../../fixtures/configs/mrope-sections-contiguous.json"), "utf8"),
) as Record<string, unknown>;
const SECTIONS = [16, 24, 24];
const model = {
  headDim: 128,
  ropeTheta: 1e6,
  trainedContext: 32768,
  attentionHeads: 28,
  kvHeads: 4,
  hiddenSize: 3584,
  layers: 4,
  mropeSection: SECTIONS,
};
const request = (modelType: string, method: MethodParams["method"]) => ({
  model,
  config: { ...fixture, model_type: modelType },
  targetContext: 131072,
  method: { method } as MethodParams,
});
const HF = ["transformers-v4-early", "transformers-v4", "transformers-v5"];

describe("the stacks whose rigging keeps the sections come from the targets", () => {
  it("a qwen2_vl model: every stack for a new base or YaRN; linear loses vLLM and SGLang; dynamic only transformers", () => {
    expect(stacksKeepingSections(request("qwen2_vl", "ntk"))).toEqual([...HF, "vllm", "sglang", "llama-cpp"]);
    expect(stacksKeepingSections(request("qwen2_vl", "yarn"))).toEqual([...HF, "vllm", "sglang", "llama-cpp"]);
    expect(stacksKeepingSections(request("qwen2_vl", "linear"))).toEqual([...HF, "llama-cpp"]);
    expect(stacksKeepingSections(request("qwen2_vl", "dynamic"))).toEqual(HF);
  });

  it("llama.cpp is named only where its architecture runs this layout", () => {
    // qwen3vl runs interleaved sections; this model declares contiguous ones
    expect(stacksKeepingSections(request("qwen3_vl", "ntk"))).toEqual([...HF, "vllm", "sglang"]);
    // an architecture with no multi-section rope
    expect(stacksKeepingSections(request("sections_test", "ntk"))).toEqual([...HF, "vllm", "sglang"]);
  });

  it("each target's applied artifact holds the model's own sections; a model without them has none to keep", () => {
    const out = exportPlan({ ...request("qwen2_vl", "ntk"), targets: TARGET_IDS });
    const config: Record<string, unknown> = { ...fixture, model_type: "qwen2_vl" };
    for (const t of out.targets) {
      const held = SECTIONS_WITH_ARTIFACT[t.id](config, t.artifact!);
      // llama.cpp's GGUF key holds four entries, padded with zeros (convert_hf_to_gguf.py, llama-cpp.ts)
      expect((held?.mrope_section as number[]).slice(0, 3), t.id).toEqual(SECTIONS);
    }
    const { rope_scaling: _, ...plain } = config;
    const { mropeSection: __, ...plainModel } = model;
    expect(stacksKeepingSections({ ...request("qwen2_vl", "ntk"), model: plainModel, config: plain })).toEqual([]);
  });

  it("the caution names exactly the stacks it is given, or says none keeps them", () => {
    const m = { mropeSection: SECTIONS };
    const [c] = frozenBlockCautions(m, { rope_scaling: null }, { keepingTargets: [...HF, "llama-cpp"] });
    expect(c.message).toContain(`?target=<stack> (${[...HF, "llama-cpp"].join(", ")})`);
    const [none] = frozenBlockCautions(m, { rope_scaling: null }, { keepingTargets: [] });
    expect(none.message).not.toContain("?target=");
    expect(none.message).toContain("no stack's rigging keeps them for this plan");
    expect(none.message).toContain("draft a new revision");
  });
});
