import { describe, expect, it } from "vitest";
import request from "supertest";
import { makeTestApp } from "../setup/app";
import { createTestUser } from "../setup/users";
import { testDb } from "../setup/db";

const { app, agent, signIn, agentAs, deps } = makeTestApp();

describe("sign-in and sessions", () => {
  it("signs in, reports the session, signs out", async () => {
    const user = await createTestUser(["researcher", "approver"]);
    const a = await signIn(user);
    const s = await a.get("/api/auth/session").expect(200);
    expect(s.body.user).toMatchObject({ id: user.id, email: user.email, roles: ["researcher", "approver"] });
    await a.post("/api/auth/logout").set("X-CSRF-Token", a.csrf).expect(204);
    const after = await a.get("/api/auth/session").expect(200);
    expect(after.body.user).toBeNull();
  });

  it("gives a wrong password and an unknown e-mail the same answer", async () => {
    const user = await createTestUser(["viewer"]);
    const a = await agent();
    const wrong = await a
      .post("/api/auth/login")
      .set("X-CSRF-Token", a.csrf)
      .send({ email: user.email, password: "nope-nope-nope" });
    const unknown = await a
      .post("/api/auth/login")
      .set("X-CSRF-Token", a.csrf)
      .send({ email: "nobody-here@example.test", password: "nope-nope-nope" });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe("invalid_credentials");
  });

  it("sets HttpOnly, SameSite=Lax cookies and regenerates the session id at sign-in", async () => {
    const user = await createTestUser(["viewer"]);
    const a = await agent();
    const before = await a.get("/api/auth/session");
    const login = await a.post("/api/auth/login").set("X-CSRF-Token", before.body.csrfToken).send(user).expect(200);
    const cookie = String(login.headers["set-cookie"]);
    expect(cookie).toMatch(/rw\.sid=/);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i); // not in test; production sets Secure (see next test)
    expect(login.body.csrfToken).not.toBe(before.body.csrfToken);
    // The pre-sign-in session row is gone: regenerate destroyed it.
    const first = await testDb().pool.query("SELECT count(*)::int AS n FROM session WHERE sess->>'csrfToken' = $1", [
      before.body.csrfToken,
    ]);
    expect(first.rows[0].n).toBe(0);
  });

  it("marks the cookie Secure in production", async () => {
    // Production behind a TLS proxy: the app sees the proxy's X-Forwarded-Proto.
    const { app: secureApp } = makeTestApp({ cookieSecure: true, trustProxy: true });
    const r = await request(secureApp).get("/api/auth/session").set("X-Forwarded-Proto", "https");
    expect(String(r.headers["set-cookie"])).toMatch(/;\s*Secure/i);
  });

  it("refuses a state change without the CSRF token (403)", async () => {
    const a = await agentAs(["admin"]);
    const r = await a
      .post("/api/users")
      .send({ email: "x@example.test", name: "X", password: "long-enough-1", roles: ["viewer"] });
    expect(r.status).toBe(403);
    expect(r.body.error.code).toBe("csrf");
    const wrong = await a.post("/api/auth/logout").set("X-CSRF-Token", "not-the-token");
    expect(wrong.status).toBe(403);
  });

  it("rate-limits sign-in per account and address (429)", async () => {
    const limited = makeTestApp({
      login: { perAccountAddress: 3, perAddress: 1000, windowMs: 60_000, perAccount: 1000, accountWindowMs: 60_000 },
    });
    const user = await createTestUser(["viewer"]);
    const a = await limited.agent();
    const statuses: number[] = [];
    for (let i = 0; i < 5; i++) {
      const r = await a
        .post("/api/auth/login")
        .set("X-CSRF-Token", a.csrf)
        .send({ email: user.email, password: "wrong-password" });
      statuses.push(r.status);
    }
    expect(statuses).toEqual([401, 401, 401, 429, 429]);
    const last = await a.post("/api/auth/login").set("X-CSRF-Token", a.csrf).send(user);
    expect(last.status).toBe(429);
    expect(last.body.error.code).toBe("rate_limited");
  });

  it("rate-limits sign-in per address across accounts (429)", async () => {
    const limited = makeTestApp({
      login: { perAccountAddress: 1000, perAddress: 2, windowMs: 60_000, perAccount: 1000, accountWindowMs: 60_000 },
    });
    const a = await limited.agent();
    const codes = [];
    for (const email of ["a1@example.test", "a2@example.test", "a3@example.test"]) {
      codes.push(
        (await a.post("/api/auth/login").set("X-CSRF-Token", a.csrf).send({ email, password: "whatever-1" })).status,
      );
    }
    expect(codes).toEqual([401, 401, 429]);
  });

  it("ends a deactivated user's sessions", async () => {
    const admin = await agentAs(["admin"]);
    const victim = await agentAs(["researcher"]);
    await victim.get("/api/auth/session").expect((r) => expect(r.body.user.id).toBe(victim.user!.id));
    await admin
      .patch(`/api/users/${victim.user!.id}`)
      .set("X-CSRF-Token", admin.csrf)
      .send({ active: false })
      .expect(200);
    const s = await victim.get("/api/auth/session");
    expect(s.body.user).toBeNull();
    const rows = await deps.pool.query("SELECT count(*)::int AS n FROM session WHERE sess->>'userId' = $1", [
      String(victim.user!.id),
    ]);
    expect(rows.rows[0].n).toBe(0);
    const again = await agent();
    const r = await again.post("/api/auth/login").set("X-CSRF-Token", again.csrf).send(victim.user!);
    expect(r.status).toBe(401);
  });

  it("refuses at once a session ended or a user deactivated by another instance (rows changed in the database)", async () => {
    // The session read and the user read are prepared statements, never answered from memory: each request reads both.
    const a = await agentAs(["researcher"]);
    const b = await agentAs(["researcher"]);
    for (let i = 0; i < 3; i++) await a.get("/api/auth/session").expect((r) => expect(r.body.user.id).toBe(a.user!.id));
    for (let i = 0; i < 3; i++) await b.get("/api/auth/session").expect((r) => expect(r.body.user.id).toBe(b.user!.id));
    await deps.pool.query("DELETE FROM session WHERE sess->>'userId' = $1", [String(a.user!.id)]);
    await deps.pool.query("UPDATE users SET active = false WHERE id = $1", [b.user!.id]);
    expect((await a.get("/api/auth/session")).body.user).toBeNull();
    expect((await b.get("/api/auth/session")).body.user).toBeNull();
    const model = { headDim: 64, ropeTheta: 10_000, trainedContext: 4096 };
    const ask = { model, targetContext: 8192, methods: [{ method: "default" }] };
    // refused either way: 403 when the session's CSRF token went with it, 401 when nobody is signed in
    for (const who of [a, b]) {
      const r = await who.post("/api/analyses").set("X-CSRF-Token", who.csrf).send(ask);
      expect([401, 403]).toContain(r.status);
      expect(r.body.methods).toBeUndefined();
    }
  });

  it("lets a user change their own password", async () => {
    const a = await agentAs(["viewer"]);
    const bad = await a
      .post("/api/auth/password")
      .set("X-CSRF-Token", a.csrf)
      .send({ currentPassword: "wrong", newPassword: "new-password-456" });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty("currentPassword");
    await a
      .post("/api/auth/password")
      .set("X-CSRF-Token", a.csrf)
      .send({ currentPassword: a.user!.password, newPassword: "new-password-456" })
      .expect(204);
    await expect(signIn({ email: a.user!.email, password: "new-password-456" })).resolves.toBeTruthy();
    await expect(signIn(a.user!)).rejects.toThrow(/401/);
  });

  it("sets security headers (helmet) and never names the framework", async () => {
    const r = await request(app).get("/api/health");
    expect(r.headers["x-content-type-options"]).toBe("nosniff");
    expect(r.headers["content-security-policy"]).toMatch(/default-src 'self'/);
    expect(r.headers["x-frame-options"]).toBe("SAMEORIGIN");
    expect(r.headers["x-powered-by"]).toBeUndefined();
  });

  it("answers 503 on health when the database is down", async () => {
    const { createApp } = await import("../../server/app");
    const { createDb } = await import("../../server/db/client");
    const dead = createDb("postgres://app@127.0.0.1:1/nowhere", 1);
    const r = await request(createApp({ ...dead, config: deps.config })).get("/api/health");
    expect(r.status).toBe(503);
    expect(r.body).toEqual({ ok: false, db: "down" });
    await dead.pool.end();
  });

  it("answers health with the database state", async () => {
    const r = await request(app).get("/api/health").expect(200);
    expect(r.body).toEqual({ ok: true, db: "up" });
  });
});
