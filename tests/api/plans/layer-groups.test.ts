import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { exportEnvelopeSchema, revisionResponseSchema } from "../../../shared/schemas/plans";
import { makeTestApp, type Agent } from "../../setup/app";
import { decide, post, put } from "../../setup/plans";
import { handFingerprint, plainRope } from "../../setup/hand-fingerprint";

/*
 * Plans on a layered model (issue 11): five local-window layers (base 10 000, window 1024) per full-attention layer
 * (base 1e6, trained 16 384). The plan scales the full layers; the local layers stay exactly as trained unless the
 * plan names a method for them, and every group is analysed, frozen and exported.
 */
const { agentAs } = makeTestApp();
const fixture = (n: string) => fs.readFileSync(path.join(import.meta.dirname, "../../fixtures/configs", n));

async function layeredModel(a: Agent) {
  const r = await a
    .post("/api/models/import?save=true")
    .set("X-CSRF-Token", a.csrf)
    .field("overrides", JSON.stringify({ name: `Windowed-${Math.random().toString(36).slice(2, 8)}`, parameters: 3e9 }))
    .attach("file", fixture("sliding-full-local-base.json"), "config.json")
    .expect(201);
  return r.body.saved.id as number;
}

const plan = (modelId: number, revision: Record<string, unknown> = {}) => ({
  title: `Layered ${Math.random().toString(36).slice(2, 7)}`,
  modelId,
  revision: { targetContext: 65536, method: { method: "yarn" }, ...revision },
});

describe("a plan holds a method per layer group", () => {
  it("by default scales the full-attention layers and leaves the local layers as trained; export keeps them", async () => {
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    const modelId = await layeredModel(researcher);
    const created = await post(researcher, "/api/plans", plan(modelId)).expect(201);
    const base = `/api/plans/${created.body.id}/revisions/1`;
    const rev = revisionResponseSchema.parse((await researcher.get(base).expect(200)).body);
    const groups = rev.content.results.groups!;
    expect(groups.map((g) => [g.kind, g.method, g.scaled, g.checkedUpTo])).toEqual([
      // Local layers attend at most 1024 positions back (their window), well inside the trained 16 384.
      ["sliding_attention", "default", false, 1024],
      ["full_attention", "yarn", true, 65536],
    ]);
    const local = groups[0];
    // As trained, nothing the plan does reaches them: no unseen angles, no compressed resolution. (Pairs whose
    // wavelength exceeds the trained length are a property of the base and stay flagged as information.)
    expect(local.summary).toMatchObject({ unseenAnglesPairs: 0, compressedResolutionPairs: 0 });
    expect(local.patch.rope_scaling).toBeNull();
    // The scaled group is the plan's own result.
    expect(groups[1].patch).toEqual(rev.content.results.final.patch);

    await post(researcher, `${base}/submit`).expect(200);
    await decide(approver, `${base}/decisions`, { decision: "approve" }).expect(200);
    const exp = exportEnvelopeSchema.parse(
      (await researcher.get(`/api/plans/${created.body.id}/approved/export`).expect(200)).body,
    );
    expect(exp.layerGroups!.find((g) => g.kind === "sliding_attention")).toMatchObject({
      method: "default",
      ropeTheta: 10_000,
      config: { rope_scaling: null },
    });
    // v5 nesting: the local entry is exactly the trained setting, the full entry carries YaRN over the 1e6 base.
    expect(exp.ropeParametersByLayerType!.sliding_attention).toEqual({ rope_type: "default", rope_theta: 10_000 });
    expect(exp.ropeParametersByLayerType!.full_attention).toMatchObject({
      rope_type: "yarn",
      rope_theta: 1e6,
      original_max_position_embeddings: 16384,
    });
  });

  it("a method for the local layers is analysed at the target; naming a group wrongly is a 400 on that field", async () => {
    const researcher = await agentAs(["researcher"]);
    const modelId = await layeredModel(researcher);
    const created = await post(
      researcher,
      "/api/plans",
      plan(modelId, { groupMethods: [{ kind: "sliding_attention", method: { method: "linear" } }] }),
    ).expect(201);
    const base = `/api/plans/${created.body.id}/revisions/1`;
    const rev = revisionResponseSchema.parse((await researcher.get(base).expect(200)).body);
    expect(rev.content.results.groups![0]).toMatchObject({
      kind: "sliding_attention",
      method: "linear",
      checkedUpTo: 65536,
    });

    for (const [kind, message] of [
      ["full_attention", /plan's own method/],
      ["chunked_attention", /no chunked_attention layers/],
    ] as const) {
      const bad = await put(researcher, base, {
        version: rev.version,
        groupMethods: [{ kind, method: { method: "linear" } }],
      }).expect(400);
      expect(bad.body.error.fields["groupMethods.0.kind"]).toMatch(message);
    }
  });

  it("a one-group model's revision content carries no group results (its hash inputs are as before)", async () => {
    const researcher = await agentAs(["researcher"]);
    const m = await post(researcher, "/api/models", {
      name: `Plain-${Math.random().toString(36).slice(2, 8)}`,
      family: "plain",
      headDim: 128,
      ropeTheta: 10000,
      trainedContext: 4096,
      layers: 8,
      attentionHeads: 16,
      kvHeads: 16,
      hiddenSize: 2048,
      parameters: 1e9,
    }).expect(201);
    const created = await post(researcher, "/api/plans", {
      ...plan(m.body.model.id),
      revision: { targetContext: 16384, method: { method: "yarn" } },
    }).expect(201);
    const rev = (await researcher.get(`/api/plans/${created.body.id}/revisions/1`).expect(200)).body;
    expect(rev.content.results.groups).toBeUndefined();
    expect(rev.content.model.layerGroups).toBeUndefined();
  });
});

describe("the fingerprint, the conformance matrix and the report cover every layer group", () => {
  it("a linear ×4 plan on the layered model: one fingerprint record per group, v5 exact per group, flat stacks unsupported", async () => {
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    const modelId = await layeredModel(researcher);
    const method = { method: "linear", factor: 4 };
    const created = await post(researcher, "/api/plans", plan(modelId, { method })).expect(201);
    const base = `/api/plans/${created.body.id}/revisions/1`;
    const rev = (await researcher.get(base).expect(200)).body;
    // Layers 0–4 (local, as trained over 10 000) come first, then layer 5 (full, 1e6 / 4): docs/fingerprint.md.
    const expected = handFingerprint([
      { d: 256, a: 1, theta: plainRope(256, 1e4) },
      { d: 256, a: 1, theta: plainRope(256, 1e6).map((t) => t / 4) },
    ]);
    expect(rev.rotaryFingerprint).toBe(expected);
    // POST /api/exports on the profile (the workbench and the matrix) computes the same fingerprint.
    const fresh = await post(researcher, "/api/exports", { model: { modelId }, targetContext: 65536, method }).expect(
      200,
    );
    expect(fresh.body.fingerprint).toBe(expected);
    const v5 = fresh.body.targets.find((t: { id: string }) => t.id === "transformers-v5");
    expect(v5.conformance.groups.map((g: { kind: string; status: string }) => [g.kind, g.status])).toEqual([
      ["sliding_attention", "exact"],
      ["full_attention", "exact"],
    ]);
    for (const t of fresh.body.targets.filter((x: { id: string }) => x.id !== "transformers-v5")) {
      expect(t.conformance.status, t.id).toBe("unsupported");
      expect(t.conformance.cause, t.id).toMatch(/sliding_attention layers/);
    }

    await post(researcher, `${base}/submit`).expect(200);
    await decide(approver, `${base}/decisions`, { decision: "approve" }).expect(200);
    const exp = await researcher.get(`/api/plans/${created.body.id}/approved/export?target=vllm`).expect(200);
    expect(exp.body.fingerprint).toBe(expected);
    expect(exp.body.target.conformance.status).toBe("unsupported");

    // The signed report lists each group with its own flags.
    const report = await researcher.get(`${base}/report`).expect(200);
    expect(report.text).toContain("<h2>Layer groups</h2>");
    expect(report.text).toMatch(/<tr data-kind="sliding_attention"><td>sliding_attention \(10 layers: 0–4, 6–10\)/);
  });
});

describe("a plan on a model with multimodal sections says which axis each section rotates", () => {
  it("contiguous [16, 24, 24]: the snapshot keeps the sections, the report names each axis and its pairs", async () => {
    const researcher = await agentAs(["researcher"]);
    const saved = await researcher
      .post("/api/models/import?save=true")
      .set("X-CSRF-Token", researcher.csrf)
      .field(
        "overrides",
        JSON.stringify({ name: `Sections-${Math.random().toString(36).slice(2, 8)}`, parameters: 7e9 }),
      )
      .attach("file", fixture("mrope-sections-contiguous.json"), "config.json")
      .expect(201);
    const created = await post(researcher, "/api/plans", {
      title: `Sections ${Math.random().toString(36).slice(2, 7)}`,
      modelId: saved.body.saved.id,
      revision: { targetContext: 131072, method: { method: "yarn" } },
    }).expect(201);
    const base = `/api/plans/${created.body.id}/revisions/1`;
    const rev = revisionResponseSchema.parse((await researcher.get(base).expect(200)).body);
    expect(rev.content.model).toMatchObject({ mropeSection: [16, 24, 24], mropeInterleaved: false });
    const report = (await researcher.get(`${base}/report`).expect(200)).text;
    expect(report).toContain("<h2>Multimodal sections</h2>");
    // transformers qwen2_vl apply_multimodal_rotary_pos_emb: block i of mrope_section takes axis i % 3.
    expect(report).toMatch(/<li data-axis="temporal"><strong>temporal<\/strong>: 16 pairs \(0–15\)/);
    expect(report).toMatch(/<li data-axis="height"><strong>height<\/strong>: 24 pairs \(16–39\)/);
    expect(report).toMatch(/<li data-axis="width"><strong>width<\/strong>: 24 pairs \(40–63\)/);
  });
});
