import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { TARGETS, exportForTargets } from "../../../../server/engine/targets";
import type { TargetArtifact } from "../../../../server/engine/targets/types";
import { compactJson } from "../../../../server/engine/targets/engines/launch-text";
import { planInput } from "./helpers";

/*
 * The multimodal YaRN classes of the two Python serving engines, pinned to values worked by hand from the YaRN
 * definition (Peng et al. 2023, "YaRN: Efficient Context Window Extension of Large Language Models", §3.2: a pair
 * whose wavelength λ_j = 2π·b^(2j/d) fits r = L/λ_j times into the original length L is kept when r > β_fast and
 * interpolated when r < β_slow, a linear ramp between). Solving r = L/λ_j for j gives the ramp ends
 * j(β) = d·ln(L/(2πβ)) / (2·ln b), floored (β_fast) and ceiled (β_slow) when truncate is on.
 *
 * Hand-worked for d = 128, b = 10 000, s = 4, β = 32 and 1 (2·ln b = 18.42068):
 * - from L = 4096:   j(32) = 128·ln(20.372)/18.42068 = 20.94 → 20;  j(1) = 128·ln(651.90)/18.42068 = 45.03 → 46
 * - from L = 16 384: j(32) = 128·ln(81.487)/18.42068 = 30.58 → 30;  j(1) = 128·ln(2607.6)/18.42068 = 54.66 → 55
 * and j(β) is a function of L/β alone, so 16 384 with β = 128 and 4 gives 20 and 46 again.
 * Magnitude g(s) = 0.1·ln 4 + 1 = 1.1386294361 (the paper's √(1/t) = 0.1·ln s + 1).
 */
const D = 128;
const B = 10000;
const L = 4096;
const S = 4;
const theta = (j: number) => Math.pow(B, (-2 * j) / D);
const G = 0.1 * Math.log(S) + 1;
/** θ′_j on a ramp from `low` to `high` (keep = 1 − (j − low)/(high − low), clamped). */
const ramped = (j: number, low: number, high: number) => {
  const keep = 1 - Math.min(1, Math.max(0, (j - low) / (high - low)));
  return (theta(j) / S) * (1 - keep) + theta(j) * keep;
};

const MODEL = {
  model_type: "sections_test",
  head_dim: D,
  hidden_size: 2048,
  num_attention_heads: 16,
  max_position_embeddings: L,
  rope_theta: B,
};
const yarnBlock = (extra: Record<string, unknown> = {}) => ({
  rope_type: "yarn",
  factor: S,
  original_max_position_embeddings: L,
  beta_fast: 32,
  beta_slow: 1,
  rope_theta: B,
  ...extra,
});
const vllmArtifact = (block: Record<string, unknown>): TargetArtifact => ({
  kind: "launch-args",
  content: { args: ["--hf-overrides", compactJson({ rope_parameters: block }), "--max-model-len", String(L * S)] },
  text: "",
});
const sglangArtifact = (block: Record<string, unknown>): TargetArtifact => ({
  kind: "launch-args",
  content: {
    args: [
      "--json-model-override-args",
      compactJson({ rope_scaling: block, max_position_embeddings: L * S }),
      "--context-length",
      String(L * S),
    ],
  },
  text: "",
});
const SECTIONS = { mrope_section: [16, 24, 24] };

describe("vLLM's multimodal YaRN class (mrope.py at dba39a5/055e47c): the ramp from 4 × the original length", () => {
  it("a block with sections reads the ramp ends 30 and 55 (from 16 384), the plain block 20 and 46", () => {
    const mm = TARGETS.vllm.read(MODEL, vllmArtifact(yarnBlock(SECTIONS)));
    const plain = TARGETS.vllm.read(MODEL, vllmArtifact(yarnBlock()));
    for (const j of [0, 20, 29, 30, 40, 54, 55, 63]) {
      expect(mm.invFreq[j], `pair ${j}`).toBeCloseTo(ramped(j, 30, 55), 15);
      expect(plain.invFreq[j], `pair ${j}`).toBeCloseTo(ramped(j, 20, 46), 15);
    }
    // pair 29 is kept whole in the multimodal class and already 9/26 interpolated in the plain one
    expect(mm.invFreq[29]).toBe(theta(29));
    expect(plain.invFreq[29]).toBeLessThan(theta(29));
    expect(mm.originalLength).toBe(4 * L);
    expect(mm.attentionFactor).toBeCloseTo(G, 15);
  });

  it("takes its magnitude from attn_factor and ignores attention_factor", () => {
    const r = TARGETS.vllm.read(MODEL, vllmArtifact(yarnBlock({ ...SECTIONS, attention_factor: 1, attn_factor: 0.5 })));
    expect(r.attentionFactor).toBeCloseTo(G * 0.5, 15);
  });

  it("β × 4 puts the ramp back at 20 and 46: the compiled artifact reads back as the plan", () => {
    const cfg = { ...MODEL, rope_scaling: { rope_type: "default", ...SECTIONS } };
    const [out] = exportForTargets(planInput(cfg, { method: "yarn" }, { d: D, base: B, trained: L, target: L * S }), [
      "vllm",
    ]);
    const block = (out.artifact!.content.hfOverrides as Record<string, Record<string, unknown>>).rope_parameters;
    expect(block).toMatchObject({ rope_type: "yarn", beta_fast: 128, beta_slow: 4, ...SECTIONS });
    expect(out.conformance.status, out.conformance.cause).toBe("exact");
    out.readBack!.invFreq.forEach((v, j) => expect(v, `pair ${j}`).toBeCloseTo(ramped(j, 20, 46), 15));
  });

  it("a plan's own attention factor is written as attn_factor = a / g(s) and reads back", () => {
    const cfg = { ...MODEL, rope_scaling: { rope_type: "default", ...SECTIONS, mrope_interleaved: true } };
    const [out] = exportForTargets(
      planInput(cfg, { method: "yarn", attentionFactor: 1 }, { d: D, base: B, trained: L, target: L * S }),
      ["vllm"],
    );
    const block = (out.artifact!.content.hfOverrides as Record<string, Record<string, unknown>>).rope_parameters;
    expect(block.attn_factor).toBeCloseTo(1 / G, 15);
    expect(block.mrope_interleaved).toBe(true);
    expect(out.readBack!.attentionFactor).toBeCloseTo(1, 15);
    expect(out.conformance.status, out.conformance.cause).toBe("exact");
  });

  it("sections that do not sum to d/2 stop vLLM at load (mrope.py asserts it): unsupported, reader refuses", () => {
    const bad = { mrope_section: [16, 24, 20] };
    const cfg = { ...MODEL, rope_scaling: { rope_type: "default", ...bad } };
    const [out] = exportForTargets(planInput(cfg, { method: "yarn" }, { d: D, base: B, trained: L, target: L * S }), [
      "vllm",
    ]);
    expect(out.conformance.status).toBe("unsupported");
    expect(out.conformance.cause).toContain("sum(mrope_section) == rotary_dim // 2");
    expect(out.conformance.cause).toContain("sum to 60, the model rotates 64 pairs");
    expect(() => TARGETS.vllm.read(MODEL, vllmArtifact(yarnBlock(bad)))).toThrow(/sum to 60/);
  });
});

describe("SGLang's YaRNScalingMRotaryEmbedding (mrope.py at 020d83a, factory.py at eb047c1): plain YaRN", () => {
  it("reads the ramp from the original length itself (20 and 46) and g(s) × attn_factor, as the plain class", () => {
    const mm = TARGETS.sglang.read(MODEL, sglangArtifact(yarnBlock({ ...SECTIONS, attn_factor: 0.5 })));
    const plain = TARGETS.sglang.read(MODEL, sglangArtifact(yarnBlock({ attn_factor: 0.5 })));
    for (const j of [0, 20, 29, 40, 46, 63]) {
      expect(mm.invFreq[j], `pair ${j}`).toBeCloseTo(ramped(j, 20, 46), 15);
    }
    expect(mm.invFreq).toEqual(plain.invFreq);
    expect(mm.attentionFactor).toBeCloseTo(G * 0.5, 15);
    expect(mm.originalLength).toBe(L);
  });

  it("the extrapolation factor scales the kept share in the multimodal class too", () => {
    const r = TARGETS.sglang.read(MODEL, sglangArtifact(yarnBlock({ ...SECTIONS, extrapolation_factor: 0.5 })));
    // pair 0 is fully kept (keep = 1), scaled by 0.5: θ/s·0.5 + θ·0.5
    expect(r.invFreq[0]).toBeCloseTo((theta(0) / S) * 0.5 + theta(0) * 0.5, 15);
  });
});

const fixture = (n: string) =>
  JSON.parse(fs.readFileSync(path.join(import.meta.dirname, "../../../fixtures/configs", n), "utf8")) as Record<
    string,
    unknown
  >;

describe("the hand-written multimodal fixtures on the engines", () => {
  it("interleaved sections with a short sum: vLLM refuses at load, SGLang rescales the sections and says so", () => {
    const cfg = fixture("mrope-sections-interleaved-bad-sum.json");
    const shape = { d: 128, base: 5e6, trained: 262144, target: 1048576 };
    const [vllm, sglang] = exportForTargets(planInput(cfg, { method: "yarn" }, shape), ["vllm", "sglang"]);
    expect(vllm.conformance.status).toBe("unsupported");
    expect(sglang.conformance.status, sglang.conformance.cause).toBe("exact");
    expect(sglang.conformance.cause).toContain("rescales mrope_section");
  });
});
