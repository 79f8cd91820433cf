import { describe, expect, it } from "vitest";
import { METHOD_IDS, type MethodId } from "../../../shared/schemas/analysis";
import { llamaCppTarget } from "../../../server/engine/targets/llama-cpp";
import { exportForTargets } from "../../../server/engine/targets/registry";
import { inverseFrequencies } from "../../../server/engine/frequencies";
import type { TargetArtifact } from "../../../server/engine/targets/types";
import {
  exampleOf,
  inputFor,
  LLAMA2_LIKE,
  LLAMA31_LIKE,
  maxRelError,
  roundTrip,
  shellWords,
  VARIANTS,
} from "./engine-fixtures";

/** float32 parameters (base, 1/scale, attention factor) keep llama.cpp within float32 round-off of the plan. */
const FLOAT32 = 1e-6;
/** Methods the GGUF runtime cannot express with flags or metadata (see the target's causes). */
const TENSOR_ONLY: MethodId[] = ["llama3", "longrope"];
const args = (...a: string[]): TargetArtifact => ({ kind: "launch-args", content: { args: a }, text: "" });

describe("llama.cpp target: every method × two lengths", () => {
  for (const id of METHOD_IDS) {
    for (const target of [16_384, 65_536]) {
      it(`${id} at ${target} tokens`, () => {
        const input = inputFor(exampleOf(id), target);
        const { compiled, reading } = roundTrip(llamaCppTarget, input);
        if (TENSOR_ONLY.includes(id)) {
          expect(compiled.ok).toBe(false);
          expect(compiled.artifact).toBeUndefined();
          if (!compiled.ok) expect(compiled.cause).toMatch(/tensor/);
          return;
        }
        // dynamic: unsupported, but its fallback (the plan's base at l, fixed) reads back to the plan at l
        expect(compiled.ok).toBe(id !== "dynamic");
        expect(reading!.warnings).toEqual([]);
        expect(reading!.rotaryDim).toBe(128);
        expect(maxRelError(reading!, input.plan)).toBeLessThanOrEqual(FLOAT32);
        const a = compiled.artifact!.content.args as string[];
        expect(shellWords(compiled.artifact!.text).slice(-a.length)).toEqual(a);
        expect(a.slice(0, 4)).toEqual(["-c", String(target), "--override-kv", `llama.context_length=int:${target}`]);
      });
    }
  }
  for (const { params, target } of VARIANTS) {
    it(`${JSON.stringify(params).slice(0, 80)} at ${target}`, () => {
      const input = inputFor(params, target);
      const { compiled, reading } = roundTrip(llamaCppTarget, input);
      if (TENSOR_ONLY.includes(params.method)) return expect(compiled.ok).toBe(false);
      if (params.method === "yarn" && params.truncate === false) {
        // ggml_rope_yarn_corr_dims always floors/ceils: the fallback differs from the untruncated plan
        expect(compiled.ok).toBe(false);
        expect(maxRelError(reading!, input.plan)).toBeGreaterThan(FLOAT32);
        return;
      }
      expect(compiled.ok).toBe(true);
      expect(reading!.warnings).toEqual([]);
      expect(maxRelError(reading!, input.plan)).toBeLessThanOrEqual(FLOAT32);
    });
  }
});

describe("llama.cpp target: check values from outside the project", () => {
  it("PI (Chen et al. 2023) with --rope-scale 4 (common/arg.cpp: rope_freq_scale = 1/N): every pair divided by 4, exactly", () => {
    const input = inputFor({ method: "linear" }, 16_384);
    const { reading } = roundTrip(llamaCppTarget, input);
    expect(maxRelError(reading!, input.plan)).toBeLessThanOrEqual(1e-12);
  });

  it("YaRN (Peng et al. 2023): ramp pairs 20-46 at L = 4096, a = 0.1·ln 16 + 1 computed by ggml from 1/freq_scale", () => {
    const { reading } = roundTrip(llamaCppTarget, inputFor({ method: "yarn" }, 65_536));
    const theta = inverseFrequencies(128, 10_000);
    for (let j = 0; j <= 20; j++) expect(reading!.invFreq[j] / theta[j]).toBeCloseTo(1, 14);
    for (let j = 46; j < 64; j++) expect(reading!.invFreq[j] / theta[j]).toBeCloseTo(1 / 16, 14);
    expect(reading!.attentionFactor).toBeCloseTo(1.2773, 4);
  });

  it("NTK-aware base (bloc97 2023, common practice): the slowest pair s = 3 times slower, within float32 (the base is a C float)", () => {
    const input = inputFor({ method: "ntk", factor: 3 }, 12_288);
    const { reading } = roundTrip(llamaCppTarget, input);
    const theta = inverseFrequencies(128, 10_000);
    expect((reading!.invFreq[63] * 3) / theta[63]).toBeCloseTo(1, 6);
    const err = maxRelError(reading!, input.plan);
    expect(err).toBeGreaterThan(0);
    expect(err).toBeLessThanOrEqual(FLOAT32);
  });
});

describe("llama.cpp consumer rules (ggml-org/llama.cpp, cited in docs/export-targets-engines.md)", () => {
  it("n_ctx above the GGUF's context_length draws the training-context-overflow warning; --override-kv lifts it", () => {
    const bare = llamaCppTarget.read(LLAMA2_LIKE, args("-c", "16384", "--rope-scaling", "linear", "--rope-scale", "4"));
    expect(bare.warnings.join()).toMatch(/possible training context overflow/);
    const lifted = llamaCppTarget.read(
      LLAMA2_LIKE,
      args("-c", "16384", "--override-kv", "llama.context_length=int:16384"),
    );
    expect(lifted.warnings).toEqual([]);
  });

  it("--rope-scaling none forces freq_scale 1 whatever --rope-scale says (llama-context.cpp)", () => {
    const r = llamaCppTarget.read(LLAMA2_LIKE, args("--rope-scaling", "none", "--rope-scale", "4"));
    const theta = inverseFrequencies(128, 10_000);
    r.invFreq.forEach((t, i) => expect(t / theta[i]).toBeCloseTo(1, 14));
  });

  it("a model converted from a llama3 config keeps its rope_freqs tensor: flags for another plan apply on top, so the target says unsupported", () => {
    const input = inputFor({ method: "yarn", factor: 2 }, 262_144, LLAMA31_LIKE, {
      d: 128,
      base: 500_000,
      trained: 131_072,
    });
    const { compiled, reading } = roundTrip(llamaCppTarget, input);
    expect(compiled.ok).toBe(false);
    if (!compiled.ok) expect(compiled.cause).toMatch(/rope_freqs/);
    expect(reading!.method).toBe("yarn + rope_freqs");
    expect(maxRelError(reading!, input.plan)).toBeGreaterThan(FLOAT32);
  });

  it("the converter takes llama3's original length from the config's top level (default 8192), not from the block", () => {
    const plain = llamaCppTarget.read(LLAMA31_LIKE, args("--rope-scaling", "none"));
    const moved = llamaCppTarget.read(
      { ...LLAMA31_LIKE, original_max_position_embeddings: 4096 },
      args("--rope-scaling", "none"),
    );
    expect(moved.invFreq).not.toEqual(plain.invFreq);
  });

  it("metadata alone (a rewritten GGUF, no flags) reads the same as the flags", () => {
    const input = inputFor({ method: "yarn" }, 65_536);
    const artifact = llamaCppTarget.compile(input).artifact!;
    const metadataOnly: TargetArtifact = { ...artifact, content: { args: [], metadata: artifact.content.metadata } };
    const r = llamaCppTarget.read(LLAMA2_LIKE, metadataOnly);
    expect(maxRelError(r, input.plan)).toBeLessThanOrEqual(FLOAT32);
  });
});

describe("a compiler that cannot handle the model's config", () => {
  it("marks only its own target unsupported: a LongRoPE config.json (factor tensors in the GGUF) with a yarn plan", () => {
    const longropeConfig = {
      ...LLAMA2_LIKE,
      rope_scaling: {
        rope_type: "longrope",
        short_factor: [1],
        long_factor: [1],
        original_max_position_embeddings: 4096,
      },
    };
    const out = exportForTargets(inputFor(exampleOf("yarn"), 16_384, longropeConfig));
    const llama = out.find((t) => t.id === "llama-cpp")!;
    expect(llama.conformance.status).toBe("unsupported");
    expect(llama.conformance.cause).toMatch(/factor tensors/);
    expect(out.filter((t) => t.id !== "llama-cpp").every((t) => t.artifact !== null)).toBe(true);
  });
});
