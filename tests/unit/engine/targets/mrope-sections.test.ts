import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import type { MethodParams } from "../../../../shared/schemas/analysis";
import { TARGETS, applyMergePatch, exportForTargets, type TargetId } from "../../../../server/engine/targets";
import { planInput } from "./helpers";

/*
 * A model with multimodal sections keeps them through every config.json export: its attention layers read the
 * sections on every forward pass (huggingface/transformers src/transformers/models/qwen2_vl/modeling_qwen2_vl.py at
 * 00b676f8, Qwen2VLAttention.forward: `apply_multimodal_rotary_pos_emb(…, self.rope_scaling["mrope_section"])`), so
 * a patch that removes `rope_scaling` (a method exported as a new base) or leaves out its `mrope_section` breaks the
 * model at its first step. The check is on the config.json after the merge patch (RFC 7396), as a loader reads it.
 */
const config = (n: string) =>
  JSON.parse(fs.readFileSync(path.join(import.meta.dirname, "../../../fixtures/configs", n), "utf8")) as Record<
    string,
    unknown
  >;
const HF: TargetId[] = ["transformers-v4-early", "transformers-v4", "transformers-v5"];
const METHODS: MethodParams[] = [
  { method: "ntk" },
  { method: "linear", factor: 4 },
  { method: "yarn" },
  { method: "default" },
];
const CASES = [
  {
    file: "mrope-sections-contiguous.json",
    shape: { d: 128, base: 1e6, trained: 32768, target: 131072 },
    keys: { mrope_section: [16, 24, 24] },
  },
  {
    file: "mrope-sections-interleaved-bad-sum.json",
    shape: { d: 128, base: 5e6, trained: 262144, target: 1048576 },
    keys: { mrope_section: [24, 20, 16], mrope_interleaved: true },
  },
];

/** The block a loader of that line reads the sections from, after the patch: rope_scaling (4.x), rope_parameters (v5). */
function sectionsBlock(id: TargetId, merged: Record<string, unknown>) {
  return (id === "transformers-v5" ? merged.rope_parameters : merged.rope_scaling) as Record<string, unknown> | null;
}

describe("multimodal sections survive every transformers export", () => {
  for (const { file, shape, keys } of CASES) {
    for (const id of HF) {
      for (const method of METHODS) {
        it(`${file} × ${id} × ${method.method}`, () => {
          const cfg = config(file);
          const [out] = exportForTargets(planInput(cfg, method, shape), [id]);
          const merged = applyMergePatch(cfg, out.artifact!.content) as Record<string, unknown>;
          const block = sectionsBlock(id, merged);
          expect(block).toMatchObject(keys);
          // the renamed spelling is gone, so a 4.x config class cannot rewrite the method back ("type" wins there)
          expect(block).not.toHaveProperty("type");
          expect(out.conformance.status, out.conformance.cause).toBe("exact");
          expect(TARGETS[id].read(cfg, out.artifact!, shape.target).warnings).toEqual([]);
        });
      }
    }
  }
});

/*
 * vLLM's --hf-overrides and SGLang's --json-model-override-args replace the whole block, and both get_rope functions
 * build a multimodal rotary only for rope_type "default" or "yarn" with mrope_section in the block (vLLM:
 * vllm/model_executor/layers/rotary_embedding/__init__.py at 07b12f1; SGLang: rotary_embedding/factory.py at eb047c1).
 * vLLM's multimodal rotary asserts that the sections sum to rotary_dim / 2 (mrope.py at dba39a5 and 055e47c), so the
 * bad-sum fixture cannot run there at all; SGLang rescales such sections and runs (mrope.py at 020d83a).
 */
const ENGINES = [
  { id: "vllm" as const, name: "vLLM", block: (c: Record<string, unknown>) => c.hfOverrides, key: "rope_parameters" },
  {
    id: "sglang" as const,
    name: "SGLang",
    block: (c: Record<string, unknown>) => c.modelOverrides,
    key: "rope_scaling",
  },
];
describe("serving engines: the sections go into the overridden block; a type get_rope runs on one axis is refused", () => {
  for (const engine of ENGINES) {
    for (const { file, shape, keys } of CASES) {
      for (const method of METHODS) {
        const sectioned = method.method !== "linear";
        const stops = sectioned && engine.id === "vllm" && file.includes("bad-sum");
        const outcome = stops ? "unsupported, stops at load" : sectioned ? "exact, sections kept" : "unsupported";
        it(`${engine.id}: ${file} × ${method.method}: ${outcome}`, () => {
          const cfg = config(file);
          const [out] = exportForTargets(planInput(cfg, method, shape), [engine.id]);
          if (stops) {
            expect(out.artifact).toBeNull();
            expect(out.conformance.status).toBe("unsupported");
            expect(out.conformance.cause).toContain("asserts sum(mrope_section) == rotary_dim // 2");
            return;
          }
          const overrides = engine.block(out.artifact!.content as Record<string, unknown>) as Record<string, unknown>;
          expect(overrides[engine.key]).toMatchObject(keys);
          if (sectioned) {
            expect(out.conformance.status, out.conformance.cause).toBe("exact");
          } else {
            expect(out.conformance.status).toBe("unsupported");
            expect(out.conformance.cause).toContain(
              `${engine.name} builds multimodal sections only for rope_type default or yarn`,
            );
          }
        });
      }
    }
  }
});
