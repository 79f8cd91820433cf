import request from "supertest";
import { describe, expect, it } from "vitest";
import { makeTestApp } from "../../setup/app";
import { ownerTestDb, testDb } from "../../setup/db";
import { createPlan, createProfile, decide, post } from "../../setup/plans";
import { exportCurlExample } from "../../../client/src/features/tokens/curl-example";

const { app, agentAs } = makeTestApp();

async function approvedPlan() {
  const researcher = await agentAs(["researcher"]);
  const model = await createProfile(researcher);
  const plan = await createPlan(researcher, model.id);
  await post(researcher, `/api/plans/${plan.id}/revisions/1/submit`).expect(200);
  const ap = await agentAs(["approver"]);
  await decide(ap, `/api/plans/${plan.id}/revisions/1/decisions`, { decision: "approve" }).expect(200);
  return plan;
}

describe("API tokens", () => {
  it("create (shown once, stored hashed), use for export, revoke → 401", async () => {
    const plan = await approvedPlan();
    const infra = await agentAs(["infra"]);
    const created = await post(infra, "/api/tokens", { name: "training job" }).expect(201);
    const secret: string = created.body.token;
    expect(secret).toMatch(/^rw_/);
    const stored = await testDb().pool.query("SELECT token_hash FROM api_tokens WHERE id = $1", [created.body.id]);
    expect(stored.rows[0].token_hash).not.toContain(secret);
    expect(stored.rows[0].token_hash).toMatch(/^[0-9a-f]{64}$/);
    const list = await infra.get("/api/tokens").expect(200);
    expect(JSON.stringify(list.body)).not.toContain(secret);

    const exp = await request(app)
      .get(`/api/plans/${plan.id}/approved/export`)
      .set("Authorization", `Bearer ${secret}`)
      .expect(200);
    expect(exp.body.config.rope_scaling.rope_type).toBe("yarn");
    expect(exp.headers["set-cookie"]).toBeUndefined();
    const used = await infra.get("/api/tokens");
    expect(used.body.tokens[0].lastUsedAt).not.toBeNull();
    const audit = await testDb().pool.query(
      "SELECT detail FROM audit_events WHERE action = 'revision.exported' AND subject_id = $1",
      [String(plan.id)],
    );
    expect(audit.rows.some((r) => r.detail.via === "token")).toBe(true);

    await infra.delete(`/api/tokens/${created.body.id}`).set("X-CSRF-Token", infra.csrf).expect(204);
    const after = await request(app)
      .get(`/api/plans/${plan.id}/approved/export`)
      .set("Authorization", `Bearer ${secret}`);
    expect(after.status).toBe(401);
  });

  it("the profile page's curl line names a route a new token may call, with the header it needs", async () => {
    const plan = await approvedPlan();
    const infra = await agentAs(["infra"]);
    const secret: string = (await post(infra, "/api/tokens", { name: "from the example" }).expect(201)).body.token;
    const line = exportCurlExample("https://ropewalk.lab.test");
    expect(line).toContain('-H "Authorization: Bearer $ROPEWALK_TOKEN"');
    const url = new URL(line.match(/"(https:[^"]+)"/)![1]);
    const exp = await request(app)
      .get(`${url.pathname.replace("/42/", `/${plan.id}/`)}${url.search}`)
      .set("Authorization", `Bearer ${secret}`)
      .expect(200);
    expect(exp.body.target.id).toBe(url.searchParams.get("target"));
  });

  it("a token cannot write, and a made-up token gets 401", async () => {
    const researcher = await agentAs(["researcher"]);
    const created = await post(researcher, "/api/tokens", { name: "ci" }).expect(201);
    const w = await request(app)
      .post("/api/plans")
      .set("Authorization", `Bearer ${created.body.token}`)
      .send({ title: "x" });
    expect(w.status).toBe(403);
    expect(w.body.error.code).toBe("read_only_token");
    const d = await request(app)
      .delete(`/api/tokens/${created.body.id}`)
      .set("Authorization", `Bearer ${created.body.token}`);
    expect(d.status).toBe(403);
    expect((await request(app).get("/api/plans").set("Authorization", "Bearer rw_nope")).status).toBe(401);
  });

  it("someone else's token cannot be revoked", async () => {
    const a = await agentAs(["viewer"]);
    const b = await agentAs(["viewer"]);
    const t = await post(a, "/api/tokens", { name: "mine" }).expect(201);
    expect((await b.delete(`/api/tokens/${t.body.id}`).set("X-CSRF-Token", b.csrf)).status).toBe(404);
  });
});

describe("audit trail", () => {
  it("records transitions and decisions; admins and approvers browse and filter, others may not", async () => {
    const plan = await approvedPlan();
    const admin = await agentAs(["admin"]);
    const r = await admin.get(`/api/audit?subjectType=plan&subjectId=${plan.id}`).expect(200);
    const actions = r.body.events.map((e: { action: string }) => e.action).reverse();
    expect(actions).toEqual(["plan.created", "revision.submitted", "decision.approved", "revision.approved"]);
    const filtered = await admin.get(`/api/audit?subjectType=plan&subjectId=${plan.id}&action=decision.`).expect(200);
    expect(filtered.body.events).toHaveLength(1);
    expect(filtered.body.events[0].detail.signedHash).toMatch(/^[0-9a-f]{64}$/);
    const approver = await agentAs(["approver"]);
    await approver.get("/api/audit").expect(200);
    for (const role of ["researcher", "infra", "viewer"] as const) {
      const a = await agentAs([role]);
      expect((await a.get("/api/audit")).status).toBe(403);
    }
    expect((await admin.get("/api/audit?from=yesterday")).status).toBe(400);
  });

  it("the database refuses to change or delete audit rows", async () => {
    // The app role lacks the privilege; even the owner meets the append-only trigger.
    for (const pool of [testDb().pool, ownerTestDb().pool]) {
      await expect(
        pool.query("UPDATE audit_events SET action = 'x' WHERE id = (SELECT min(id) FROM audit_events)"),
      ).rejects.toThrow(/append-only|permission denied/);
      await expect(
        pool.query("DELETE FROM audit_events WHERE id = (SELECT min(id) FROM audit_events)"),
      ).rejects.toThrow(/append-only|permission denied/);
    }
  });
});
