import { describe, expect, it } from "vitest";
import type { MethodParams } from "../../../../shared/schemas/analysis";
import { METHOD_CATALOG } from "../../../../shared/methods";
import { TARGETS, conformance, exportForTargets } from "../../../../server/engine/targets";
import { LLAMA_LIKE, legacyArtifact, planInput } from "./helpers";

/**
 * The defects issue 10 quotes, reproduced on the export Ropewalk wrote before export targets (the method's config patch
 * serialised by JSON.stringify) and shown gone with the compiled artifacts. The grids are ours; the counts came
 * from its own grid, so the counts here are reported, not copied.
 */
const configFor = (d: number, base: number, trained: number) => ({
  ...LLAMA_LIKE,
  hidden_size: d * 32,
  rope_theta: base,
  max_position_embeddings: trained,
});

function grid(factors: number[]) {
  const out: { d: number; base: number; trained: number; target: number }[] = [];
  for (const d of [64, 96, 128, 256])
    for (const base of [1e4, 5e5, 1e6])
      for (const trained of [2048, 4096, 8192, 32768])
        for (const s of factors) out.push({ d, base, trained, target: trained * s });
  return out;
}

function count(shapes: ReturnType<typeof grid>, method: (d: number) => MethodParams, id: "transformers-v4-early") {
  let legacyDiffers = 0;
  let compiledDiffers = 0;
  for (const shape of shapes) {
    const config = configFor(shape.d, shape.base, shape.trained);
    const input = planInput(config, method(shape.d), shape);
    const legacy = TARGETS[id].read(config, legacyArtifact(input), shape.target);
    if (conformance(input.plan, legacy).status === "differs") legacyDiffers++;
    const [compiled] = exportForTargets(input, [id]);
    if (compiled.conformance.status !== "exact") compiledDiffers++;
  }
  return { legacyDiffers, compiledDiffers };
}

describe("4.4x rules read the old export differently", () => {
  it("yarn: the old export's ramp is built from max_position_embeddings (the target) under 4.45 rules", () => {
    const shapes = grid([1.5, 2, 3, 4, 6, 8, 10, 16, 32, 64]);
    expect(shapes).toHaveLength(480);
    const { legacyDiffers, compiledDiffers } = count(shapes, () => ({ method: "yarn" }), "transformers-v4-early");
    console.info(
      `yarn, 4.45 rules: old export differs in ${legacyDiffers}/480; compiled artifact in ${compiledDiffers}/480`,
    );
    expect(legacyDiffers).toBeGreaterThan(450); // the issue measured 476/480 on its grid
    expect(compiledDiffers).toBe(0);
  });
  it("longrope: 4.45 rules read the original length only at the top level, so the old block-level one is ignored", () => {
    const shapes = grid([2, 4, 8, 16, 32]);
    expect(shapes).toHaveLength(240);
    const method = (d: number) => METHOD_CATALOG.longrope.example(d / 2);
    const { legacyDiffers, compiledDiffers } = count(shapes, method, "transformers-v4-early");
    console.info(
      `longrope, 4.45 rules: old export differs in ${legacyDiffers}/240; compiled in ${compiledDiffers}/240`,
    );
    expect(legacyDiffers).toBe(240); // the issue: 240 of 240
    expect(compiledDiffers).toBe(0);
  });
});

describe("rope_parameters configs lose the base with the old export", () => {
  const v5Config = (() => {
    const { rope_theta: _t, rope_scaling: _r, ...rest } = LLAMA_LIKE;
    return { ...rest, rope_parameters: { rope_type: "default", rope_theta: 500000.0 } };
  })();
  const shape = { d: 128, base: 500000, trained: 8192, target: 32768 };
  it("a rope_scaling block without rope_theta replaces rope_parameters and the base falls back to 10 000", () => {
    const input = planInput(v5Config, { method: "yarn" }, shape);
    const old = TARGETS["transformers-v5"].read(v5Config, legacyArtifact(input), shape.target);
    expect(old.base).toBe(10000);
    expect(conformance(input.plan, old).status).toBe("differs");
    const [compiled] = exportForTargets(input, ["transformers-v5"]);
    expect(compiled.conformance.status).toBe("exact");
  });
  it("a new top-level rope_theta (adjusted base) is ignored: the inner rope_theta stays in force", () => {
    const input = planInput(v5Config, { method: "base", base: 2_000_000 }, shape);
    const old = TARGETS["transformers-v5"].read(v5Config, legacyArtifact(input), shape.target);
    expect(old.base).toBe(500000);
    const [compiled] = exportForTargets(input, ["transformers-v5"]);
    expect(compiled.conformance.status).toBe("exact");
    expect(compiled.artifact!.content.rope_parameters).toMatchObject({ rope_theta: 2_000_000 });
  });
});

describe("whole-number factors", () => {
  it("were written as JSON integers, which the 4.x validator warns about; the compiled text keeps a decimal point", () => {
    const shape = { d: 128, base: 500000, trained: 8192, target: 32768 };
    const input = planInput(LLAMA_LIKE, { method: "linear" }, shape);
    const old = legacyArtifact(input);
    expect(old.text).toMatch(/"factor": 4\b(?!\.)/);
    expect(TARGETS["transformers-v4"].read(LLAMA_LIKE, old, shape.target).warnings).toContain(
      "rope_scaling's factor field must be a float >= 1, got 4",
    );
    const [compiled] = exportForTargets(input, ["transformers-v4"]);
    expect(compiled.artifact!.text).toMatch(/"factor": 4\.0/);
    expect(TARGETS["transformers-v4"].read(LLAMA_LIKE, compiled.artifact!, shape.target).warnings).toEqual([]);
  });
});
