import request from "supertest";
import { describe, expect, it } from "vitest";
import { makeTestApp } from "../setup/app";
import { testDb } from "../setup/db";
import { post } from "../setup/plans";

const { app, agentAs } = makeTestApp();
const withToken = (token: string, path: string) => request(app).get(path).set("Authorization", `Bearer ${token}`);

describe("API token scopes", () => {
  it("defaults to export:read, stores it, lists it and audits it", async () => {
    const a = await agentAs(["researcher"]);
    const created = await post(a, "/api/tokens", { name: "default" }).expect(201);
    expect(created.body.scopes).toEqual(["export:read"]);
    const row = await testDb().pool.query("SELECT scopes FROM api_tokens WHERE id = $1", [created.body.id]);
    expect(row.rows[0].scopes).toEqual(["export:read"]);
    const list = await a.get("/api/tokens").expect(200);
    expect(list.body.tokens[0].scopes).toEqual(["export:read"]);
    const audit = await testDb().pool.query(
      "SELECT detail FROM audit_events WHERE action = 'token.created' AND subject_id = $1",
      [String(created.body.id)],
    );
    expect(audit.rows[0].detail).toMatchObject({ scopes: ["export:read"] });
  });

  it("refuses unknown, empty or repeated scopes with a 400 naming scopes, and writes nothing", async () => {
    const a = await agentAs(["researcher"]);
    for (const scopes of [["admin"], [], ["export:read", "export:read"], "export:read"]) {
      const r = await post(a, "/api/tokens", { name: "bad", scopes });
      expect(r.status, JSON.stringify(scopes)).toBe(400);
      expect(Object.keys(r.body.error.fields).some((f) => f.startsWith("scopes"))).toBe(true);
    }
    const n = await testDb().pool.query("SELECT count(*)::int AS n FROM api_tokens WHERE user_id = $1", [a.user!.id]);
    expect(n.rows[0].n).toBe(0);
  });

  it("an export:read token reads plans but, even an admin's, never users, audit, mail, tokens or the session", async () => {
    const admin = await agentAs(["admin", "approver", "researcher"]);
    const token = (await post(admin, "/api/tokens", { name: "admin's job", scopes: ["export:read"] }).expect(201)).body
      .token as string;
    expect((await withToken(token, "/api/plans")).status).toBe(200);
    expect((await withToken(token, "/api/plans/settings")).status).toBe(200);
    // The same admin with a session reads these …
    await admin.get("/api/users").expect(200);
    await admin.get("/api/audit").expect(200);
    // … the token does not.
    for (const path of [
      "/api/users",
      "/api/audit",
      "/api/mail",
      "/api/tokens",
      "/api/models",
      "/api/auth/session",
      "/api/accelerators",
    ]) {
      const r = await withToken(token, path);
      expect(r.status, path).toBe(403);
      expect(r.body.error.code, path).toBe("token_scope");
    }
    // Writes stay refused as before.
    const w = await request(app).post("/api/plans").set("Authorization", `Bearer ${token}`).send({ title: "x" });
    expect(w.status).toBe(403);
    expect(w.body.error.code).toBe("read_only_token");
  });
});
