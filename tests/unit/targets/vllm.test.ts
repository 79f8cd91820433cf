import { describe, expect, it } from "vitest";
import { METHOD_IDS } from "../../../shared/schemas/analysis";
import { vllmTarget } from "../../../server/engine/targets/vllm";
import { inverseFrequencies } from "../../../server/engine/frequencies";
import { exampleOf, inputFor, LLAMA2_LIKE, maxRelError, roundTrip, shellWords, VARIANTS } from "./engine-fixtures";

const TARGETS = [16_384, 65_536];
const overridesOf = (args: string[]) => JSON.parse(args[args.indexOf("--hf-overrides") + 1]) as Record<string, unknown>;

describe("vLLM target: every method compiles, reads back to the plan's frequencies, and passes vLLM's own checks", () => {
  for (const id of METHOD_IDS) {
    for (const target of TARGETS) {
      it(`${id} at ${target} tokens: exact, no warning`, () => {
        const input = inputFor(exampleOf(id), target);
        const { compiled, reading } = roundTrip(vllmTarget, input);
        expect(compiled.ok).toBe(true);
        expect(reading!.warnings).toEqual([]);
        expect(reading!.rotaryDim).toBe(128);
        expect(maxRelError(reading!, input.plan)).toBeLessThanOrEqual(1e-12);
        // the downloadable line carries exactly these arguments
        const args = compiled.artifact!.content.args as string[];
        expect(shellWords(compiled.artifact!.text).slice(-args.length)).toEqual(args);
        expect(args.slice(-2)).toEqual(["--max-model-len", String(target)]);
      });
    }
  }
});

describe("vLLM target: explicit attention factors, the mscale pair, untruncated ramps, other band factors", () => {
  for (const { params, target } of VARIANTS) {
    it(`${JSON.stringify(params).slice(0, 80)} at ${target}: exact, no warning`, () => {
      const input = inputFor(params, target);
      const { compiled, reading } = roundTrip(vllmTarget, input);
      expect(compiled.ok).toBe(true);
      expect(reading!.warnings).toEqual([]);
      expect(maxRelError(reading!, input.plan)).toBeLessThanOrEqual(1e-12);
    });
  }
});

describe("vLLM target: check values from outside the project", () => {
  it("PI (Chen et al. 2023): every pair divided by s = 4", () => {
    const { reading } = roundTrip(vllmTarget, inputFor({ method: "linear" }, 16_384));
    const theta = inverseFrequencies(128, 10_000);
    reading!.invFreq.forEach((t, i) => expect((t * 4) / theta[i]).toBeCloseTo(1, 14));
  });

  it("YaRN (Peng et al. 2023, Eqs. 17-22): pairs 0-20 kept, 46-63 divided by 16, a = 0.1·ln 16 + 1 = 1.2773", () => {
    const { reading } = roundTrip(vllmTarget, inputFor({ method: "yarn" }, 65_536));
    const theta = inverseFrequencies(128, 10_000);
    for (let j = 0; j <= 20; j++) expect(reading!.invFreq[j] / theta[j]).toBeCloseTo(1, 14);
    for (let j = 46; j < 64; j++) expect(reading!.invFreq[j] / theta[j]).toBeCloseTo(1 / 16, 14);
    expect(reading!.attentionFactor).toBeCloseTo(1.2773, 4);
    expect(reading!.originalLength).toBe(4096);
  });

  it("NTK-aware base (bloc97 2023, common practice): the slowest pair ends exactly s = 8 times slower", () => {
    const { reading } = roundTrip(vllmTarget, inputFor({ method: "ntk" }, 32_768));
    const theta = inverseFrequencies(128, 10_000);
    expect((reading!.invFreq[63] * 8) / theta[63]).toBeCloseTo(1, 12);
  });

  it("dynamic NTK (vLLM dynamic_ntk_scaling_rope.py): the base is fixed at f·L, b·(f² − f + 1)^(d/(d−2)); f = 8 → 57^(64/63)", () => {
    const { reading } = roundTrip(vllmTarget, inputFor({ method: "dynamic" }, 32_768));
    expect(reading!.invFreq[1] / Math.pow(10_000 * Math.pow(57, 64 / 63), -2 / 128)).toBeCloseTo(1, 14);
    // the model's max_position_embeddings stays the trained length: vLLM uses it as L
    const overrides = overridesOf(
      roundTrip(vllmTarget, inputFor({ method: "dynamic" }, 32_768)).compiled.artifact!.content.args as string[],
    );
    expect(overrides.max_position_embeddings).toBe(4096);
  });

  it("dynamic NTK run at a length other than f·L: vLLM's fixed base differs from the plan, and the read-back says so", () => {
    const input = inputFor({ method: "dynamic", factor: 8, sequenceLength: 16_384 }, 32_768);
    const { reading } = roundTrip(vllmTarget, input);
    expect(maxRelError(reading!, input.plan)).toBeGreaterThan(1e-6);
  });

  it("LongRoPE (Ding et al. 2024): a = √(1 + ln 32 / ln 4096) = √(17/12) at 32× (long factors, since max_model_len > original)", () => {
    const input = inputFor(exampleOf("longrope"), 32 * 4096);
    const { reading } = roundTrip(vllmTarget, input);
    expect(reading!.attentionFactor).toBeCloseTo(Math.sqrt(17 / 12), 15);
  });

  it("adjusted base (Xiong et al. 2023, 10 000 → 500 000): θ_1 = 500 000^(−2/128), rope_theta written at the top level too", () => {
    const { compiled, reading } = roundTrip(vllmTarget, inputFor({ method: "base", base: 500_000 }, 16_384));
    expect(reading!.invFreq[1] / Math.pow(500_000, -2 / 128)).toBeCloseTo(1, 14);
    const overrides = overridesOf(compiled.artifact!.content.args as string[]);
    expect(overrides.rope_theta).toBe(500_000);
    expect((overrides.rope_parameters as Record<string, unknown>).rope_theta).toBe(500_000);
    expect(compiled.artifact!.content.args).toEqual(
      expect.arrayContaining([expect.stringContaining('"rope_theta":500000.0')]),
    );
  });
});

describe("vLLM consumer rules (vllm-project/vllm, cited in docs/export-targets-engines.md)", () => {
  it("_get_and_verify_max_len: a yarn factor below target/L leaves max_model_len above L·factor, which vLLM refuses", () => {
    const { reading } = roundTrip(vllmTarget, inputFor({ method: "yarn", factor: 2 }, 16_384));
    expect(reading!.warnings.join()).toMatch(/VLLM_ALLOW_LONG_MAX_MODEL_LEN/);
  });

  it("patch_rope_parameters (transformers v4): the top-level rope_theta is copied over the block's", () => {
    const args = [
      "--hf-overrides",
      '{"rope_scaling":{"rope_type":"default","rope_theta":500000.0}}',
      "--max-model-len",
      "4096",
    ];
    const reading = vllmTarget.read(LLAMA2_LIKE, { kind: "launch-args", content: { args }, text: "" });
    expect(reading.base).toBe(10_000);
  });

  it("a legacy `type` key is read as rope_type; a conflicting pair is refused", () => {
    const legacy = ["--hf-overrides", '{"rope_scaling":{"type":"linear","factor":2.0}}'];
    expect(vllmTarget.read(LLAMA2_LIKE, { kind: "launch-args", content: { args: legacy }, text: "" }).method).toBe(
      "linear",
    );
    const conflict = ["--hf-overrides", '{"rope_scaling":{"type":"linear","rope_type":"yarn","factor":2.0}}'];
    expect(() => vllmTarget.read(LLAMA2_LIKE, { kind: "launch-args", content: { args: conflict }, text: "" })).toThrow(
      /conflicts/,
    );
  });

  it("whole-number floats are written with a decimal point; an integer factor draws the validator's warning", () => {
    const { compiled } = roundTrip(vllmTarget, inputFor({ method: "linear" }, 16_384));
    expect(compiled.artifact!.content.args).toEqual(expect.arrayContaining([expect.stringContaining('"factor":4.0')]));
    const yarn = [
      "--hf-overrides",
      '{"rope_scaling":{"rope_type":"yarn","factor":4,"original_max_position_embeddings":4096}}',
    ];
    const reading = vllmTarget.read(LLAMA2_LIKE, { kind: "launch-args", content: { args: yarn }, text: "" });
    expect(reading.warnings.join()).toMatch(/factor.*float/);
  });

  it("linear_scaling_rope.py wraps only a float factor in a list: an integer factor makes vLLM fail", () => {
    const args = [
      "--hf-overrides",
      '{"rope_scaling":{"rope_type":"linear","factor":4},"max_position_embeddings":16384}',
    ];
    expect(() => vllmTarget.read(LLAMA2_LIKE, { kind: "launch-args", content: { args }, text: "" })).toThrow(/integer/);
  });
});
