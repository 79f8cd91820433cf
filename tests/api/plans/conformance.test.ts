import request from "supertest";
import { describe, expect, it } from "vitest";
import { makeTestApp, type Agent } from "../../setup/app";
import { testDb } from "../../setup/db";
import { createPlan, createProfile, post } from "../../setup/plans";
import { probeDocument, runProbe, writeConfig, writeStandIn } from "../../setup/probe";

const { app, agentAs } = makeTestApp();

/** The fixture profile: 128-dim, base 10 000, trained 4096, 32 heads of a 4096 hidden size. */
const CONFIG = { model_type: "llama", hidden_size: 4096, num_attention_heads: 32, max_position_embeddings: 4096 };

async function planWith(researcher: Agent, method: Record<string, unknown>) {
  const model = await createProfile(researcher);
  const revision = { targetContext: 32768, method, stages: [], acceptance: [], notes: "probe check" };
  return createPlan(researcher, model.id, { revision });
}

const checksRows = async (planId: number) =>
  (await testDb().pool.query("SELECT * FROM conformance_checks WHERE plan_id = $1", [planId])).rows;
const auditRows = async (planId: number) =>
  (
    await testDb().pool.query(
      "SELECT detail FROM audit_events WHERE action = 'conformance.recorded' AND subject_id = $1",
      [String(planId)],
    )
  ).rows;

describe("conformance checks: probe results recorded on a revision", () => {
  it("the probe's own output for a linear ×8 plan passes: θ′ = θ/8 (Chen et al. 2023, position interpolation)", async () => {
    const researcher = await agentAs(["researcher"]);
    const plan = await planWith(researcher, { method: "linear", factor: 8 });
    const config = { ...CONFIG, rope_theta: 10000.0, rope_scaling: { rope_type: "linear", factor: 8.0 } };
    const run = runProbe(["--config", writeConfig(config), "--length", "32768"], writeStandIn("v4"));
    expect(run.status, run.stderr).toBe(0);

    const r = await post(researcher, `/api/plans/${plan.id}/revisions/1/conformance-checks`, JSON.parse(run.stdout));
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body).toMatchObject({ revision: 1, passed: true, via: "session", library: "transformers", cause: "" });
    // float64 on both sides: only pow's last-place rounding separates them
    expect(r.body.maxRelativeError).toBeLessThanOrEqual(1e-12);

    const [row] = await checksRows(plan.id);
    expect(row).toMatchObject({ passed: true, via: "session", content_hash: plan.revisions[0].contentHash });
    const audit = await auditRows(plan.id);
    expect(audit).toHaveLength(1);
    expect(audit[0].detail).toMatchObject({ revision: 1, check: r.body.id, passed: true, via: "session" });

    // the probe was given no fingerprint to check; pointed at this revision's, the check says it matches
    expect(r.body.fingerprintMatches).toBeNull();
    const { body: rev } = await researcher.get(`/api/plans/${plan.id}/revisions/1`).expect(200);
    const aimed = { ...JSON.parse(run.stdout), planFingerprint: rev.rotaryFingerprint };
    const again = await post(researcher, `/api/plans/${plan.id}/revisions/1/conformance-checks`, aimed).expect(201);
    expect(again.body.fingerprintMatches).toBe(true);
    const elsewhere = { ...aimed, planFingerprint: "f".repeat(64) };
    const wrong = await post(researcher, `/api/plans/${plan.id}/revisions/1/conformance-checks`, elsewhere);
    expect(wrong.body.fingerprintMatches).toBe(false);

    const list = await researcher.get(`/api/plans/${plan.id}/conformance-checks`).expect(200);
    expect(list.body.checks).toHaveLength(3);
    expect(list.body.checks[0]).toMatchObject({ id: r.body.id, revision: 1, passed: true });
  });

  it("a linear reading of a yarn ×8 plan fails on the fast pairs yarn keeps unscaled (Peng et al. 2023, eq. 18–19)", async () => {
    const researcher = await agentAs(["researcher"]);
    const plan = await planWith(researcher, { method: "yarn", factor: 8 });
    const approver = await agentAs(["approver"]);
    const r = await post(approver, `/api/plans/${plan.id}/revisions/1/conformance-checks`, probeDocument(128, 1e4, 8));
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    // Pairs below the ramp's start keep θ_i (extrapolation) while the reading has θ_i/8: error |θ/8 − θ| / θ = 7/8.
    // The ramp starts at floor(d·ln(L/(2π·β_fast)) / (2 ln b)) = floor(128·ln(4096/(64π)) / (2 ln 10⁴)) = 20
    // (Peng et al. 2023, eq. 17 with β_fast = 32); every pair below it ties at 7/8 up to rounding.
    expect(r.body.passed).toBe(false);
    expect(r.body.worstPair).toBeGreaterThanOrEqual(0);
    expect(r.body.worstPair).toBeLessThan(20);
    expect(r.body.maxRelativeError).toBeCloseTo(7 / 8, 12);
    expect(r.body.cause).toMatch(/^pair \d+ turns at [\d.e-]+ rad\/token, the revision's at [\d.e-]+$/);
  });

  it("a reading with the wrong rotary width fails without pairing", async () => {
    const researcher = await agentAs(["researcher"]);
    const plan = await planWith(researcher, { method: "linear", factor: 8 });
    const r = await post(researcher, `/api/plans/${plan.id}/revisions/1/conformance-checks`, probeDocument(64));
    expect(r.body).toMatchObject({ passed: false, maxRelativeError: null, worstPair: null });
    expect(r.body.cause).toBe("the library rotates 64 dimensions; the revision has 128");
  });

  it("bad JSON is a 400 naming the field, and writes nothing", async () => {
    const researcher = await agentAs(["researcher"]);
    const plan = await planWith(researcher, { method: "linear", factor: 8 });
    const url = `/api/plans/${plan.id}/revisions/1/conformance-checks`;
    const cases: [object, string][] = [
      [{ ...probeDocument(), invFreq: probeDocument().invFreq.slice(1) }, "invFreq"],
      [{ ...probeDocument(), probe: "something-else/1" }, "probe"],
      [{ ...probeDocument(), rotaryDim: 127 }, "rotaryDim"],
      [{ ...probeDocument(), readFingerprint: "XYZ" }, "readFingerprint"],
      [{ ...probeDocument(), attentionFactor: -1 }, "attentionFactor"],
    ];
    for (const [body, field] of cases) {
      const r = await post(researcher, url, body);
      expect(r.status, field).toBe(400);
      expect(Object.keys(r.body.error.fields ?? {})).toContain(field);
    }
    const missing = await post(researcher, `/api/plans/${plan.id}/revisions/9/conformance-checks`, probeDocument());
    expect(missing.status).toBe(404);
    expect(await checksRows(plan.id)).toHaveLength(0);
    expect(await auditRows(plan.id)).toHaveLength(0);
  });

  it("only researchers and approvers record checks; the rows cannot be edited by the app role", async () => {
    const researcher = await agentAs(["researcher"]);
    const plan = await planWith(researcher, { method: "linear", factor: 8 });
    const viewer = await agentAs(["viewer"]);
    const url = `/api/plans/${plan.id}/revisions/1/conformance-checks`;
    expect((await post(viewer, url, probeDocument(128, 1e4, 8))).status).toBe(403);
    await viewer.get(`/api/plans/${plan.id}/conformance-checks`).expect(200);
    await post(researcher, url, probeDocument(128, 1e4, 8)).expect(201);
    await expect(testDb().pool.query("UPDATE conformance_checks SET passed = true")).rejects.toMatchObject({
      code: "42501",
    });
  });
});

describe("conformance checks with a token", () => {
  it("conformance:write posts a check (audited as via token) and reads the list, nothing else", async () => {
    const researcher = await agentAs(["researcher"]);
    const plan = await planWith(researcher, { method: "linear", factor: 8 });
    const made = await post(researcher, "/api/tokens", { name: "probe job", scopes: ["conformance:write"] }).expect(
      201,
    );
    const bearer = `Bearer ${made.body.token}`;
    const url = `/api/plans/${plan.id}/revisions/1/conformance-checks`;

    const r = await request(app)
      .post(url)
      .set("Authorization", bearer)
      .send(probeDocument(128, 1e4, 8));
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body).toMatchObject({ passed: true, via: "token" });
    expect((await auditRows(plan.id))[0].detail.via).toBe("token");
    await request(app).get(`/api/plans/${plan.id}/conformance-checks`).set("Authorization", bearer).expect(200);

    // the scope reaches nothing else: not the plan itself, not a new plan
    expect((await request(app).get(`/api/plans/${plan.id}`).set("Authorization", bearer)).status).toBe(403);
    expect((await request(app).post("/api/plans").set("Authorization", bearer).send({})).status).toBe(403);
  });

  it("an export:read token cannot post a check", async () => {
    const researcher = await agentAs(["researcher"]);
    const plan = await planWith(researcher, { method: "linear", factor: 8 });
    const made = await post(researcher, "/api/tokens", { name: "export job" }).expect(201);
    const r = await request(app)
      .post(`/api/plans/${plan.id}/revisions/1/conformance-checks`)
      .set("Authorization", `Bearer ${made.body.token}`)
      .send(probeDocument(128, 1e4, 8));
    expect(r.status).toBe(403);
    expect(await checksRows(plan.id)).toHaveLength(0);
  });
});
