import { describe, expect, it } from "vitest";
import type { MethodParams } from "../../../../shared/schemas/analysis";
import { METHOD_IDS } from "../../../../shared/methods";
import { TARGETS, conformance, exportForTargets, type TargetId } from "../../../../server/engine/targets";
import { LLAMA_LIKE, planInput } from "./helpers";
import { samplesFor } from "../fixtures";

const HF: TargetId[] = ["transformers-v4-early", "transformers-v4", "transformers-v5"];
const SHAPE = { d: 128, base: 500000, trained: 8192, target: 32768 };

/** A v5-layout config.json: the base lives inside rope_parameters, no top-level rope_theta. */
const V5_CONFIG = (() => {
  const { rope_theta: _theta, rope_scaling: _rs, ...rest } = LLAMA_LIKE;
  return { ...rest, rope_parameters: { rope_type: "default", rope_theta: 500000.0 } };
})();

describe("every method × transformers target: the artifact reads back as the plan, with no validator warning", () => {
  const samples = samplesFor(SHAPE.d);
  for (const id of HF) {
    for (const m of METHOD_IDS) {
      for (const [name, config] of [
        ["4.x layout", LLAMA_LIKE],
        ["v5 layout", V5_CONFIG],
      ] as const) {
        it(`${id} × ${m} on a ${name} config`, () => {
          const input = planInput(config, samples[m] as MethodParams, SHAPE);
          const [out] = exportForTargets(input, [id]);
          const reading = TARGETS[id].read(config, out.artifact!, SHAPE.target);
          expect(reading.warnings).toEqual([]);
          expect(out.conformance.status, out.conformance.cause).toBe("exact");
          expect(reading.rotaryDim).toBe(128);
          // "Always emit rope_theta": at the top level for 4.x, inside rope_parameters for v5.
          const patch = out.artifact!.content as Record<string, Record<string, unknown>>;
          expect(id === "transformers-v5" ? patch.rope_parameters.rope_theta : patch.rope_theta).toBeDefined();
        });
      }
    }
  }
});

describe("yarn variants the older rules cannot all express", () => {
  const cases: [string, MethodParams][] = [
    ["mscale pair (DeepSeek-V3 style, a = 1)", { method: "yarn", mscale: 1, mscaleAllDim: 1 }],
    ["explicit attention factor", { method: "yarn", attentionFactor: 1.1 }],
    ["factor other than target/trained", { method: "yarn", factor: 5 }],
    ["betas 16/2", { method: "yarn", betaFast: 16, betaSlow: 2 }],
  ];
  for (const id of HF) {
    for (const [name, method] of cases) {
      it(`${id}: ${name} reads back exactly`, () => {
        const input = planInput(LLAMA_LIKE, method, SHAPE);
        const [out] = exportForTargets(input, [id]);
        expect(out.conformance.status, out.conformance.cause).toBe("exact");
        expect(TARGETS[id].read(LLAMA_LIKE, out.artifact!, SHAPE.target).warnings).toEqual([]);
      });
    }
  }
  it("truncate: false is unsupported under 4.4x rules (the ramp ends are always floored/ceiled there), exact later", () => {
    const input = planInput(LLAMA_LIKE, { method: "yarn", truncate: false }, SHAPE);
    const [early, v4, v5] = exportForTargets(input, HF);
    expect(early.conformance.status).toBe("unsupported");
    expect(early.conformance.workaround).toMatch(/transformers-v4/);
    expect(v4.conformance.status).toBe("exact");
    expect(v5.conformance.status).toBe("exact");
    expect(v4.artifact!.content.rope_scaling).toMatchObject({ truncate: false });
  });
});

describe("consumer facts checked with numbers from outside the project", () => {
  it("Llama 3.1's published rope block (factor 8, low 1, high 4, original 8192, θ 500 000) under the 4.x reader", () => {
    // Values of meta-llama/Llama-3.1-8B config.json, from memory: the wavelength bands are 8192/4 = 2048 and
    // 8192/1 = 8192 tokens; pairs faster than 2048 keep θ, slower than 8192 get θ/8 (the published rule).
    // The block as the published config.json spells it (floats with a decimal point), applied as a merge patch.
    const text =
      '{"max_position_embeddings": 131072, "rope_scaling": {"factor": 8.0, "low_freq_factor": 1.0, "high_freq_factor": 4.0,' +
      ' "original_max_position_embeddings": 8192, "rope_type": "llama3"}}';
    const r = TARGETS["transformers-v4"].read(LLAMA_LIKE, { kind: "config-merge-patch", content: {}, text }, 131072);
    expect(r.warnings).toEqual([]); // the published block passes the validator: its floats are written 8.0 / 1.0 / 4.0
    const theta = (i: number) => Math.pow(500000, (-2 * i) / 128);
    for (let i = 0; i < 64; i++) {
      const wave = (2 * Math.PI) / theta(i);
      if (wave < 2048) expect(Math.abs(r.invFreq[i] / theta(i) - 1)).toBeLessThan(1e-15);
      if (wave > 8192) expect(Math.abs((8 * r.invFreq[i]) / theta(i) - 1)).toBeLessThan(1e-15);
    }
  });
  it("YaRN attention factor 0.1·ln s + 1 (Peng et al. 2023, Eq. 22): s = 4 → 1.1386 under every transformers target", () => {
    const input = planInput(LLAMA_LIKE, { method: "yarn" }, SHAPE);
    for (const out of exportForTargets(input, HF)) {
      expect(out.readBack!.attentionFactor).toBeCloseTo(0.1 * Math.log(4) + 1, 15);
      expect(out.readBack!.attentionFactor).toBeCloseTo(1.1386, 4);
    }
  });
  it("NTK-aware base b·s^(d/(d−2)) (Peng et al. 2023, Eq. 16) is exported as rope_theta and read as the new base", () => {
    const input = planInput(LLAMA_LIKE, { method: "ntk" }, SHAPE);
    for (const id of HF) {
      const [out] = exportForTargets(input, [id]);
      const r = TARGETS[id].read(LLAMA_LIKE, out.artifact!, SHAPE.target);
      expect(r.base).toBeCloseTo(500000 * Math.pow(4, 128 / 126), 6);
      expect(r.invFreq[63] / Math.pow(500000, -126 / 128)).toBeCloseTo(1 / 4, 12); // slowest pair divided by exactly s
    }
  });
  it("longrope attention factor √(1 + ln s / ln L) (Ding et al. 2024) with L the trained length", () => {
    const input = planInput(LLAMA_LIKE, samplesFor(128).longrope, SHAPE);
    for (const out of exportForTargets(input, HF)) {
      expect(out.readBack!.attentionFactor).toBeCloseTo(Math.sqrt(1 + Math.log(4) / Math.log(8192)), 15);
    }
  });
  it("a Phi-3-like config with a top-level original length: 4.x longrope reads it there (and its validator says so)", () => {
    const config = { ...LLAMA_LIKE, original_max_position_embeddings: 4096 };
    const input = planInput(config, samplesFor(128).longrope, SHAPE);
    for (const id of HF) {
      const [out] = exportForTargets(input, [id]);
      expect(out.conformance.status, id).toBe("exact");
      expect(out.artifact!.content.original_max_position_embeddings).toBe(8192);
    }
    const [early] = exportForTargets(input, ["transformers-v4-early"]);
    expect(
      conformance(input.plan, TARGETS["transformers-v4-early"].read(config, early.artifact!, SHAPE.target)).cause,
    ).toMatch(/original_max_position_embeddings/);
  });
});

describe("the v5 layout", () => {
  it("merges into rope_parameters (the model's partial_rotary_factor stays) and clears a leftover rope_scaling", () => {
    const config = {
      ...V5_CONFIG,
      rope_scaling: { type: "linear", factor: 2.0 },
      rope_parameters: { rope_type: "default", rope_theta: 500000.0, partial_rotary_factor: 0.5 },
    };
    const input = planInput(config, { method: "yarn" }, { ...SHAPE, d: 64 });
    const [out] = exportForTargets(input, ["transformers-v5"]);
    expect(out.artifact!.content).toMatchObject({ rope_scaling: null });
    expect(out.artifact!.content.rope_parameters).not.toHaveProperty("partial_rotary_factor");
    const r = TARGETS["transformers-v5"].read(config, out.artifact!, SHAPE.target);
    expect(r.rotaryDim).toBe(64);
    expect(out.conformance.status, out.conformance.cause).toBe("exact");
  });
  it("nests by layer type when the config declares layer types, one block per type", () => {
    const config = { ...V5_CONFIG, layer_types: ["sliding_attention", "full_attention", "sliding_attention"] };
    const input = planInput(config, { method: "yarn" }, SHAPE);
    const [out] = exportForTargets(input, ["transformers-v5"]);
    const rp = out.artifact!.content.rope_parameters as Record<string, Record<string, unknown>>;
    expect(Object.keys(rp)).toEqual(expect.arrayContaining(["sliding_attention", "full_attention"]));
    expect(rp.full_attention).toMatchObject({
      rope_type: "yarn",
      rope_theta: 500000,
      original_max_position_embeddings: 8192,
    });
    expect(rp.rope_type).toBeNull(); // the old flat keys are removed
    expect(out.conformance.status, out.conformance.cause).toBe("exact");
    expect(TARGETS["transformers-v5"].read(config, out.artifact!, SHAPE.target).warnings).toEqual([]);
  });
});
