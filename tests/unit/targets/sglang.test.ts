import { describe, expect, it } from "vitest";
import { METHOD_IDS } from "../../../shared/schemas/analysis";
import { sglangTarget } from "../../../server/engine/targets/sglang";
import { inverseFrequencies } from "../../../server/engine/frequencies";
import type { TargetArtifact } from "../../../server/engine/targets/types";
import { exampleOf, inputFor, LLAMA2_LIKE, maxRelError, roundTrip, shellWords, VARIANTS } from "./engine-fixtures";

const overridesOf = (a: TargetArtifact) => {
  const args = a.content.args as string[];
  return JSON.parse(args[args.indexOf("--json-model-override-args") + 1]) as Record<string, unknown>;
};
const launch = (json: string, context?: number): TargetArtifact => ({
  kind: "launch-args",
  content: { args: ["--json-model-override-args", json, ...(context ? ["--context-length", String(context)] : [])] },
  text: "",
});

describe("SGLang target: every method compiles, reads back to the plan's frequencies, and passes SGLang's own checks", () => {
  for (const id of METHOD_IDS) {
    for (const target of [16_384, 65_536]) {
      it(`${id} at ${target} tokens: exact, no warning`, () => {
        const input = inputFor(exampleOf(id), target);
        const { compiled, reading } = roundTrip(sglangTarget, input);
        expect(compiled.ok).toBe(true);
        expect(reading!.warnings).toEqual([]);
        expect(maxRelError(reading!, input.plan)).toBeLessThanOrEqual(1e-12);
        const args = compiled.artifact!.content.args as string[];
        expect(shellWords(compiled.artifact!.text).slice(-args.length)).toEqual(args);
        expect(args.slice(-2)).toEqual(["--context-length", String(target)]);
      });
    }
  }
  for (const { params, target } of VARIANTS) {
    it(`${JSON.stringify(params).slice(0, 80)} at ${target}: exact, no warning`, () => {
      const input = inputFor(params, target);
      const { compiled, reading } = roundTrip(sglangTarget, input);
      expect(compiled.ok).toBe(true);
      expect(reading!.warnings).toEqual([]);
      expect(maxRelError(reading!, input.plan)).toBeLessThanOrEqual(1e-12);
    });
  }
});

describe("SGLang target: check values from outside the project", () => {
  it("YaRN (Peng et al. 2023): pairs 0-20 kept, 46-63 divided by 16, a = 1.2773 (Eq. 22)", () => {
    const { reading } = roundTrip(sglangTarget, inputFor({ method: "yarn" }, 65_536));
    const theta = inverseFrequencies(128, 10_000);
    for (let j = 0; j <= 20; j++) expect(reading!.invFreq[j] / theta[j]).toBeCloseTo(1, 14);
    for (let j = 46; j < 64; j++) expect(reading!.invFreq[j] / theta[j]).toBeCloseTo(1 / 16, 14);
    expect(reading!.attentionFactor).toBeCloseTo(1.2773, 4);
  });

  it("band-smoothed rule (Meta 2024: f = 8, low 1, high 4, L = 8192, b = 500 000): pairs 0-28 kept, 35-63 divided by 8", () => {
    const config = { ...LLAMA2_LIKE, rope_theta: 500000.0, max_position_embeddings: 8192 };
    const input = inputFor({ method: "llama3", factor: 8 }, 65_536, config, { d: 128, base: 500_000, trained: 8192 });
    const { reading } = roundTrip(sglangTarget, input);
    const theta = inverseFrequencies(128, 500_000);
    for (let j = 0; j <= 28; j++) expect(reading!.invFreq[j] / theta[j]).toBeCloseTo(1, 14);
    for (let j = 35; j < 64; j++) expect(reading!.invFreq[j] / theta[j]).toBeCloseTo(1 / 8, 14);
  });
});

describe("SGLang consumer rules (sgl-project/sglang, cited in docs/export-targets-engines.md)", () => {
  it("yarn ignores attention_factor (factory.py passes only attn_factor): the plan's factor goes through attn_factor = a / g(s)", () => {
    const ignored = sglangTarget.read(
      LLAMA2_LIKE,
      launch(
        '{"rope_scaling":{"rope_type":"yarn","factor":8.0,"original_max_position_embeddings":4096,"attention_factor":1.1},"max_position_embeddings":32768}',
        32_768,
      ),
    );
    expect(ignored.attentionFactor).toBeCloseTo(0.1 * Math.log(8) + 1, 15);
    const { compiled, reading } = roundTrip(sglangTarget, inputFor({ method: "yarn", attentionFactor: 1.1 }, 32_768));
    const block = overridesOf(compiled.artifact!).rope_scaling as Record<string, unknown>;
    expect(block.attention_factor).toBeUndefined();
    expect(block.attn_factor).toBeCloseTo(1.1 / (0.1 * Math.log(8) + 1), 15);
    expect(reading!.attentionFactor).toBeCloseTo(1.1, 15);
  });

  it("get_context_length: a block naming original_max_position_embeddings is not multiplied, so --context-length past max_position_embeddings is refused", () => {
    const reading = sglangTarget.read(
      LLAMA2_LIKE,
      launch('{"rope_scaling":{"rope_type":"yarn","factor":4.0,"original_max_position_embeddings":4096}}', 16_384),
    );
    expect(reading.warnings.join()).toMatch(/SGLANG_ALLOW_OVERWRITE_LONGER_CONTEXT_LEN/);
    const { compiled } = roundTrip(sglangTarget, inputFor({ method: "yarn" }, 16_384));
    expect(overridesOf(compiled.artifact!).max_position_embeddings).toBe(16_384);
  });

  it("LongRoPE switches to the long cache per batch: past the trained length the artifact writes the long factors as both lists", () => {
    const input = inputFor(exampleOf("longrope"), 32_768);
    const { compiled, reading } = roundTrip(sglangTarget, input);
    const block = overridesOf(compiled.artifact!).rope_scaling as Record<string, unknown>;
    expect(block.short_factor).toEqual(block.long_factor);
    // a short prompt (below the original length) then turns with the same frequencies as a long one
    const short = sglangTarget.read(input.config, compiled.artifact!, 1000);
    expect(short.invFreq).toEqual(reading!.invFreq);
  });

  it("rope_type first, legacy type second; a block with neither is refused", () => {
    expect(sglangTarget.read(LLAMA2_LIKE, launch('{"rope_scaling":{"type":"linear","factor":2.0}}')).method).toBe(
      "linear",
    );
    expect(() => sglangTarget.read(LLAMA2_LIKE, launch('{"rope_scaling":{"factor":2.0}}'))).toThrow(/rope_type/);
  });
});
