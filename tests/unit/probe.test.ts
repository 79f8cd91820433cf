import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { runProbe, writeConfig, writeStandIn } from "../setup/probe";
import { rotaryFingerprint } from "../../server/engine/fingerprint";

/*
 * The probe (tools/probe/ropewalk_probe.py) under Debian's python3. `transformers` is a stand-in written by
 * tests/setup/probe.ts: these tests check the probe's own logic (which block and rope type it reads, the running
 * length it passes, the JSON it writes and its fingerprint), not the library's maths.
 */

const LLAMA_LIKE = { model_type: "llama", hidden_size: 512, num_attention_heads: 8, max_position_embeddings: 4096 };
const PLAN_FP = "ab".repeat(32);

/** docs/fingerprint.md layout, written out independently: tag, zero byte, uint32 LE dim, float64 LE factor and θ′. */
function expectedFingerprint(dim: number, factor: number, invFreq: number[]) {
  const tag = Buffer.from("ropewalk-rotary/1\0", "latin1");
  const body = Buffer.alloc(4 + 8 + 8 * invFreq.length);
  body.writeUInt32LE(dim, 0);
  body.writeDoubleLE(factor, 4);
  invFreq.forEach((f, i) => body.writeDoubleLE(f, 12 + 8 * i));
  return createHash("sha256")
    .update(Buffer.concat([tag, body]))
    .digest("hex");
}

function probeJson(config: Record<string, unknown>, flavour: "v4" | "v5", extra: string[] = []) {
  const r = runProbe(["--config", writeConfig(config), ...extra], writeStandIn(flavour));
  expect(r.stderr).toBe("");
  expect(r.status).toBe(0);
  return JSON.parse(r.stdout) as Record<string, unknown> & { invFreq: number[]; attentionFactor: number };
}

describe("probe: what it reads and writes", () => {
  it("plain rope under v4 rules: θ_i = b^(−2i/d) (Su et al. 2021, RoFormer eq. 15), echoed fingerprint, own fingerprint", () => {
    const out = probeJson({ ...LLAMA_LIKE, rope_theta: 500000 }, "v4", ["--length", "4096", "--fingerprint", PLAN_FP]);
    expect(out).toMatchObject({
      probe: "ropewalk-probe/1",
      library: "transformers",
      libraryVersion: "4.46.3+stand-in",
      ropeType: "default",
      readFrom: "none",
      runningLength: 4096,
      rotaryDim: 64,
      attentionFactor: 1,
      planFingerprint: PLAN_FP,
    });
    expect(out.invFreq).toHaveLength(32);
    expect(out.invFreq[0]).toBe(1);
    expect(out.invFreq[1]).toBeCloseTo(500000 ** (-2 / 64), 15);
    expect(out.readFingerprint).toBe(expectedFingerprint(64, 1, out.invFreq));
    // and the server's own implementation agrees, so a float64 library reproduces a revision's fingerprint exactly
    expect(out.readFingerprint).toBe(rotaryFingerprint([{ rotaryDim: 64, attentionFactor: 1, invFreq: out.invFreq }]));
  });

  it("reads the old `type` spelling from rope_scaling (v4 era)", () => {
    const out = probeJson({ ...LLAMA_LIKE, rope_theta: 10000, rope_scaling: { type: "linear", factor: 4.0 } }, "v4", [
      "--length",
      "16384",
    ]);
    expect(out).toMatchObject({ ropeType: "linear", readFrom: "rope_scaling", planFingerprint: null });
    // position interpolation: θ′_i = θ_i / s (Chen et al. 2023, eq. 2)
    expect(out.invFreq[1]).toBeCloseTo(10000 ** (-2 / 64) / 4, 15);
  });

  it("newer layout: rope_parameters read, 'default' found on the model's rotary class", () => {
    const out = probeJson({ ...LLAMA_LIKE, rope_theta: 1000000 }, "v5", ["--length", "4096"]);
    expect(out).toMatchObject({ libraryVersion: "5.0.0+stand-in", ropeType: "default", readFrom: "rope_parameters" });
    expect(out.invFreq[1]).toBeCloseTo(1000000 ** (-2 / 64), 15);
  });

  it("passes the running length through: dynamic scaling grows the base with it (emozilla 2023, common practice)", () => {
    const cfg = { ...LLAMA_LIKE, rope_theta: 10000, rope_scaling: { rope_type: "dynamic", factor: 2.0 } };
    const at = (n: number) => probeJson(cfg, "v4", ["--length", String(n)]).invFreq[1];
    const dynamicBase = (n: number) => 10000 * ((2 * n) / 4096 - 1) ** (64 / 62);
    expect(at(16384)).toBeCloseTo(dynamicBase(16384) ** (-2 / 64), 15);
    expect(at(16384)).toBeLessThan(at(8192));
  });

  it("rope_parameters nested without layer_types needs --layer-type and then reads that entry", () => {
    const cfg = {
      ...LLAMA_LIKE,
      rope_parameters: {
        full_attention: { rope_type: "linear", factor: 8.0, rope_theta: 1000000 },
        sliding_attention: { rope_type: "default", rope_theta: 10000 },
      },
    };
    const refused = runProbe(["--config", writeConfig(cfg), "--length", "4096"], writeStandIn("v5"));
    expect(refused.status).toBe(2);
    expect(refused.stderr).toMatch(
      /nested \(full_attention, sliding_attention\) but not by the config's layer_types: pass --layer-type/,
    );
    const out = probeJson(cfg, "v5", ["--length", "4096", "--layer-type", "full_attention"]);
    expect(out).toMatchObject({ ropeType: "linear", readFrom: "rope_parameters.full_attention" });
    expect(out.invFreq[1]).toBeCloseTo(1000000 ** (-2 / 64) / 8, 15);
  });
});

describe("probe: refusals the user can act on", () => {
  it("without transformers importable it says so and exits 2", () => {
    const r = runProbe(["--config", writeConfig(LLAMA_LIKE), "--length", "4096"], null);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/cannot import transformers/);
  });

  it("a rope type the installed library does not know", () => {
    const cfg = { ...LLAMA_LIKE, rope_theta: 10000, rope_scaling: { rope_type: "yarn", factor: 4.0 } };
    const r = runProbe(["--config", writeConfig(cfg), "--length", "4096"], writeStandIn("v4"));
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/no rope init function for 'yarn'/);
  });

  it("a malformed fingerprint or length is refused before anything is imported", () => {
    const dir = writeConfig(LLAMA_LIKE);
    const bad = runProbe(["--config", dir, "--length", "4096", "--fingerprint", "XYZ"], writeStandIn("v4"));
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/--fingerprint must be 64 lower-case hex digits/);
    expect(runProbe(["--config", dir, "--length", "0"], writeStandIn("v4")).stderr).toMatch(/--length must be/);
  });
});
