import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { exportEnvelopeSchema, revisionResponseSchema } from "../../../shared/schemas/plans";
import { applyMergePatch } from "../../../server/engine/targets/merge-patch";
import { rotaryFingerprint } from "../../../server/engine/fingerprint";
import { makeTestApp, type Agent } from "../../setup/app";
import { decide, post } from "../../setup/plans";
import { runProbe, writeConfig, writeStandIn } from "../../setup/probe";
import { handFingerprint, plainRope } from "../../setup/hand-fingerprint";

/*
 * A conformance check on a layered plan, end to end (issue 11): import a layered config, plan, approve, take the
 * approved transformers-v5 export, apply its merge patch to the same config.json (RFC 7396), run the probe on it
 * (tools/probe, against the stand-in library of tests/setup/probe.ts), and upload what it wrote. The revision's
 * fingerprint hashes every rotating group (docs/fingerprint.md), so the probe must read every group to be checked.
 */
const { agentAs } = makeTestApp();
const fixtureText = (n: string) => fs.readFileSync(path.join(import.meta.dirname, "../../fixtures/configs", n), "utf8");
const uniq = () => Math.random().toString(36).slice(2, 8);

interface ProbeGroup {
  layerType: string;
  layers: number[];
  ropeType: string;
  rotaryDim: number;
  attentionFactor: number;
  invFreq: number[];
}

async function approvedLayeredPlan(researcher: Agent, approver: Agent, file: string, target: number) {
  const saved = await researcher
    .post("/api/models/import?save=true")
    .set("X-CSRF-Token", researcher.csrf)
    .field("overrides", JSON.stringify({ name: `Probed-${uniq()}`, parameters: 3e9 }))
    .attach("file", Buffer.from(fixtureText(file)), "config.json")
    .expect(201);
  const created = await post(researcher, "/api/plans", {
    title: `Probed ${uniq()}`,
    modelId: saved.body.saved.id,
    revision: { targetContext: target, method: { method: "linear", factor: 4 } },
  }).expect(201);
  const base = `/api/plans/${created.body.id}/revisions/1`;
  await post(researcher, `${base}/submit`).expect(200);
  await decide(approver, `${base}/decisions`, { decision: "approve" }).expect(200);
  const rev = revisionResponseSchema.parse((await researcher.get(base).expect(200)).body);
  const exp = exportEnvelopeSchema.parse(
    (await researcher.get(`/api/plans/${created.body.id}/approved/export?target=transformers-v5`).expect(200)).body,
  );
  // the user's config.json after the export's merge patch: what the training or serving stack will load
  const config = applyMergePatch(JSON.parse(fixtureText(file)), exp.target!.artifact!.content);
  return { planId: created.body.id as number, rev, config: config as Record<string, unknown> };
}

const probeOn = (config: Record<string, unknown>, length: number, fingerprint: string) => {
  const modelType = String(config.model_type);
  const run = runProbe(
    ["--config", writeConfig(config), "--length", String(length), "--fingerprint", fingerprint],
    writeStandIn("v5", [modelType]),
  );
  expect(run.stderr).toBe("");
  expect(run.status).toBe(0);
  return JSON.parse(run.stdout) as Record<string, unknown> & { layerGroups: ProbeGroup[]; readFingerprint: string };
};

describe("a probe run on a layered plan's transformers-v5 export is accepted", () => {
  it("sliding/full with a local base: both groups read, the check holds, the fingerprint is the revision's", async () => {
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    // Full layers: base 1e6, pre-trained 16 384 (the shipped block's original length), linear ×4 to 65 536.
    // Local layers: rope_local_base_freq 1e4, as trained. head_dim 256 rotates in full.
    const { planId, rev, config } = await approvedLayeredPlan(
      researcher,
      approver,
      "sliding-full-local-base.json",
      65536,
    );
    const out = probeOn(config, 65536, rev.rotaryFingerprint!);

    // One reading per layer type, in the order of each type's first layer (layer 0 is local, layer 5 full).
    expect(out.layerGroups.map((g) => [g.layerType, g.ropeType, g.rotaryDim, g.layers])).toEqual([
      ["sliding_attention", "default", 256, [0, 1, 2, 3, 4, 6, 7, 8, 9, 10]],
      ["full_attention", "linear", 256, [5, 11]],
    ]);
    // θ_i = b^(−2i/d) (Su et al. 2021, RoFormer eq. 15); linear ×4 divides each by 4 (Chen et al. 2023, eq. 2).
    const [local, full] = out.layerGroups;
    local.invFreq.forEach((t, i) => expect(t).toBeCloseTo(plainRope(256, 1e4)[i], 14));
    full.invFreq.forEach((t, i) => expect(t / (plainRope(256, 1e6)[i] / 4) - 1).toBeLessThan(1e-12));
    // The top-level reading is the scaled group's, so a reader of the single-group format still sees the plan's block.
    expect(out).toMatchObject({ layerType: "full_attention", ropeType: "linear", rotaryDim: 256 });
    // readFingerprint: docs/fingerprint.md over both records, written out by hand from the probe's own numbers.
    expect(out.readFingerprint).toBe(
      handFingerprint([
        { d: 256, a: 1, theta: local.invFreq },
        { d: 256, a: 1, theta: full.invFreq },
      ]),
    );
    // The revision's fingerprint covers the same two records (the server's float64 θ′).
    expect(rev.rotaryFingerprint).toBe(
      handFingerprint([
        { d: 256, a: 1, theta: plainRope(256, 1e4) },
        { d: 256, a: 1, theta: plainRope(256, 1e6).map((t) => t / 4) },
      ]),
    );

    const r = await post(researcher, `/api/plans/${planId}/revisions/1/conformance-checks`, out);
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body).toMatchObject({ passed: true, fingerprintMatches: true, cause: "" });
    // float64 on both sides: only pow's last-place rounding (Python's libm against V8's) separates them
    expect(r.body.maxRelativeError).toBeLessThanOrEqual(1e-12);
  });

  it("rope_parameters nested by layer type: each entry read on its own, the check holds", async () => {
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    // Full layers: base 1e6, original 32 768 (from the shipped yarn block), linear ×4 to 131 072; local base 1e4.
    const { planId, rev, config } = await approvedLayeredPlan(
      researcher,
      approver,
      "nested-rope-parameters.json",
      131072,
    );
    const out = probeOn(config, 131072, rev.rotaryFingerprint!);
    expect(out.layerGroups.map((g) => [g.layerType, g.ropeType, g.rotaryDim, g.layers])).toEqual([
      ["sliding_attention", "default", 128, [0, 1, 2, 4, 5, 6]],
      ["full_attention", "linear", 128, [3, 7]],
    ]);
    const r = await post(researcher, `/api/plans/${planId}/revisions/1/conformance-checks`, out);
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body).toMatchObject({ passed: true, fingerprintMatches: true, cause: "" });
    expect(r.body.maxRelativeError).toBeLessThanOrEqual(1e-12);
    // the server's own fingerprint code agrees with the probe's byte layout over the probe's numbers
    expect(out.readFingerprint).toBe(
      rotaryFingerprint(
        out.layerGroups.map((g) => ({ rotaryDim: g.rotaryDim, attentionFactor: 1, invFreq: g.invFreq })),
      ),
    );
  });
});

describe("a layered revision is checked on every group", () => {
  it("local layers scaled too (a known way to break such models) fail on them, though the full layers hold", async () => {
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    const { planId, rev, config } = await approvedLayeredPlan(
      researcher,
      approver,
      "sliding-full-local-base.json",
      65536,
    );
    const params = config.rope_parameters as Record<string, unknown>;
    const scaledLocal = {
      ...config,
      rope_parameters: { ...params, sliding_attention: { rope_type: "linear", factor: 4, rope_theta: 10000 } },
    };
    const out = probeOn(scaledLocal, 65536, rev.rotaryFingerprint!);
    const r = await post(researcher, `/api/plans/${planId}/revisions/1/conformance-checks`, out).expect(201);
    expect(r.body.passed).toBe(false);
    // Every local pair reads θ/4 where the revision keeps θ: |θ/4 − θ| / θ = 3/4 (Chen et al. 2023 for θ/s).
    expect(r.body.maxRelativeError).toBeCloseTo(3 / 4, 12);
    expect(r.body.cause).toMatch(
      /^the sliding_attention layers: pair \d+ turns at [\d.e-]+ rad\/token, the revision's at /,
    );
    // the probe was aimed at this revision, but what it read is not the revision's
    expect(r.body.fingerprintMatches).toBe(true);
    expect(out.readFingerprint).not.toBe(rev.rotaryFingerprint);

    // Per group, in first-layer order (layer 0 is local): the local layers slip by 3/4 on every pair but pair 0
    // (θ_0 = 1: |1/4 − 1| / 1 = 3/4 too, so the worst is the first pair that reaches it); the full layers hold, both
    // sides computing θ/4 over b = 1e6 in float64.
    const expected = [
      {
        kind: "sliding_attention",
        layers: [0, 1, 2, 3, 4, 6, 7, 8, 9, 10],
        passed: false,
        maxRelativeError: expect.closeTo(3 / 4, 12),
        worstPair: expect.any(Number),
        cause: expect.stringMatching(/^pair \d+ turns at [\d.e-]+ rad\/token, the revision's at /),
      },
      // its worst pair is wherever pow's last-place rounding differs (Python's libm against V8's), so left open
      { kind: "full_attention", layers: [5, 11], passed: true, maxRelativeError: expect.any(Number), cause: "" },
    ];
    expect(r.body.groups).toMatchObject(expected);
    expect(Object.keys(r.body.groups[1]).sort()).toEqual(Object.keys(r.body.groups[0]).sort());
    expect(r.body.groups[1].maxRelativeError).toBeLessThanOrEqual(1e-12);
    // the list keeps them as recorded
    const list = await researcher.get(`/api/plans/${planId}/conformance-checks`).expect(200);
    expect(list.body.checks.at(-1).groups).toEqual(r.body.groups);
  });

  it("a reading of one layer type (--layer-type) does not pass a layered revision: the other layers went unread", async () => {
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    const { planId, config } = await approvedLayeredPlan(researcher, approver, "nested-rope-parameters.json", 131072);
    const run = runProbe(
      ["--config", writeConfig(config), "--length", "131072", "--layer-type", "full_attention"],
      writeStandIn("v5", [String(config.model_type)]),
    );
    expect(run.status, run.stderr).toBe(0);
    const one = JSON.parse(run.stdout);
    expect(one.layerGroups).toBeUndefined();
    const r = await post(researcher, `/api/plans/${planId}/revisions/1/conformance-checks`, one).expect(201);
    expect(r.body).toMatchObject({ passed: false, maxRelativeError: null, worstPair: null });
    expect(r.body.cause).toBe(
      "the probe read only the full_attention layers (--layer-type); the revision also rotates the " +
        "sliding_attention layers: run it without --layer-type",
    );
    // per group: the local layers went unread, the full layers read by themselves hold
    expect(r.body.groups).toMatchObject([
      {
        kind: "sliding_attention",
        layers: [0, 1, 2, 4, 5, 6],
        passed: false,
        maxRelativeError: null,
        worstPair: null,
        cause: "not read: the probe ran with --layer-type full_attention",
      },
      { kind: "full_attention", layers: [3, 7], passed: true, maxRelativeError: expect.any(Number), cause: "" },
    ]);
  });
});

describe("a malformed layered probe result", () => {
  it("is a 400 naming the group's field, and writes nothing", async () => {
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    const { planId, rev, config } = await approvedLayeredPlan(
      researcher,
      approver,
      "nested-rope-parameters.json",
      131072,
    );
    const out = probeOn(config, 131072, rev.rotaryFingerprint!);
    const url = `/api/plans/${planId}/revisions/1/conformance-checks`;
    const [local, full] = out.layerGroups;
    const cases: [unknown[], string][] = [
      [[{ ...local, invFreq: local.invFreq.slice(1) }, full], "layerGroups.0.invFreq"],
      [[local, { ...full, layers: [] }], "layerGroups.1.layers"],
      [[local, { ...local }], "layerGroups"],
    ];
    for (const [layerGroups, field] of cases) {
      const r = await post(researcher, url, { ...out, layerGroups });
      expect(r.status, field).toBe(400);
      expect(Object.keys(r.body.error.fields ?? {}), field).toContain(field);
    }
    const list = await researcher.get(`/api/plans/${planId}/conformance-checks`).expect(200);
    expect(list.body.checks).toHaveLength(0);
  });
});
