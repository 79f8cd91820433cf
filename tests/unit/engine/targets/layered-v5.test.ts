import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { TARGETS, exportForTargets } from "../../../../server/engine/targets";
import { planInput } from "./helpers";

/*
 * The transformers-v5 artifact for layered models (issue 11): rope_parameters nested by layer type, the full-attention
 * layers carrying the plan, every other layer type exactly as trained. Check value for "as trained": plain RoPE,
 * θᵢ = b^(−2i/d) (RoFormer, Su et al. 2021, eq. 15), computed here independently of the engine.
 */
const config = (n: string) =>
  JSON.parse(fs.readFileSync(path.join(import.meta.dirname, "../../../fixtures/configs", n), "utf8")) as Record<
    string,
    unknown
  >;
const plainRope = (d: number, b: number) => Array.from({ length: d / 2 }, (_, i) => b ** ((-2 * i) / d));

describe("transformers-v5 on layered configs", () => {
  it("flat config with a local base: the local entry is written as trained (default, base 10 000)", () => {
    const cfg = config("sliding-full-local-base.json");
    const input = planInput(cfg, { method: "yarn" }, { d: 256, base: 1e6, trained: 16384, target: 65536 });
    const [out] = exportForTargets(input, ["transformers-v5"]);
    const rp = out.artifact!.content.rope_parameters as Record<string, Record<string, unknown>>;
    expect(rp.sliding_attention).toEqual({ rope_type: "default", rope_theta: 10000 });
    expect(rp.full_attention).toMatchObject({ rope_type: "yarn", rope_theta: 1e6 });
    expect(out.conformance.status, out.conformance.cause).toBe("exact");
    const read = TARGETS["transformers-v5"].read(cfg, out.artifact!, 65536);
    expect(read.warnings).toEqual([]);
    const local = read.layerGroups!.find((g) => g.layerType === "sliding_attention")!;
    expect(local.method).toBe("default");
    expect(local.attentionFactor).toBe(1);
    local.invFreq.forEach((f, i) => expect(f).toBeCloseTo(plainRope(256, 10000)[i], 15));
  });

  it("nested config: the local entry is left out of the merge patch, so it stays exactly as the file had it", () => {
    const cfg = config("nested-rope-parameters.json");
    const input = planInput(cfg, { method: "yarn", factor: 8 }, { d: 128, base: 1e6, trained: 32768, target: 262144 });
    const [out] = exportForTargets(input, ["transformers-v5"]);
    const rp = out.artifact!.content.rope_parameters as Record<string, unknown>;
    expect(Object.keys(rp)).toEqual(["full_attention"]);
    const read = TARGETS["transformers-v5"].read(cfg, out.artifact!, 262144);
    const local = read.layerGroups!.find((g) => g.layerType === "sliding_attention")!;
    local.invFreq.forEach((f, i) => expect(f).toBeCloseTo(plainRope(128, 10000)[i], 15));
    expect(read.method).toBe("yarn");
    expect(out.conformance.status, out.conformance.cause).toBe("exact");
  });
});
