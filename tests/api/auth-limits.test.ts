import request from "supertest";
import { describe, expect, it } from "vitest";
import { makeTestApp } from "../setup/app";
import { createTestUser } from "../setup/users";
import { testDb } from "../setup/db";

// Addresses come from X-Forwarded-For, as behind the production proxy (TRUST_PROXY).
const limits = {
  perAccountAddress: 10,
  perAddress: 1000,
  windowMs: 15 * 60_000,
  perAccount: 25,
  accountWindowMs: 60 * 60_000,
};
const limited = makeTestApp({ trustProxy: true, login: limits });

async function anonymousFrom(address: string) {
  const a = request.agent(limited.app);
  const s = await a.get("/api/auth/session").set("X-Forwarded-For", address).expect(200);
  return { a, csrf: s.body.csrfToken as string };
}
async function tryLogin(address: string, email: string, password: string) {
  const { a, csrf } = await anonymousFrom(address);
  return a.post("/api/auth/login").set("X-Forwarded-For", address).set("X-CSRF-Token", csrf).send({ email, password });
}

describe("sign-in limits cannot be used to lock the owner out", () => {
  it("ten wrong passwords from a stranger's address leave the owner free to sign in from theirs", async () => {
    const owner = await createTestUser(["viewer"]);
    const codes: number[] = [];
    for (let i = 0; i < 11; i++) codes.push((await tryLogin("203.0.113.7", owner.email, "guess-guess-guess")).status);
    expect(codes.slice(0, 10).every((c) => c === 401)).toBe(true);
    expect(codes[10]).toBe(429);
    // Even the right password is refused from the guesser's address for now …
    expect((await tryLogin("203.0.113.7", owner.email, owner.password)).status).toBe(429);
    // … but the owner, elsewhere, signs in at once.
    const mine = await tryLogin("198.51.100.20", owner.email, owner.password);
    expect(mine.status).toBe(200);
  }, 90_000); // eleven bcrypt comparisons at cost 12 on a shared machine

  it("guessing from many addresses meets the slower per-account ceiling", async () => {
    // A small ceiling keeps the test short; the default is 50 per hour against 10 per 15 minutes per address.
    const ceiling = makeTestApp({ trustProxy: true, login: { ...limits, perAccount: 4 } });
    const owner = await createTestUser(["viewer"]);
    const codes: number[] = [];
    for (let i = 0; i < 5; i++) {
      const a = request.agent(ceiling.app);
      const address = `192.0.2.${i + 1}`;
      const s = await a.get("/api/auth/session").set("X-Forwarded-For", address);
      const r = await a
        .post("/api/auth/login")
        .set("X-Forwarded-For", address)
        .set("X-CSRF-Token", s.body.csrfToken)
        .send({ email: owner.email, password: "guess-guess-guess" });
      codes.push(r.status);
    }
    expect(codes).toEqual([401, 401, 401, 401, 429]);
  }, 60_000);

  it("rate-limits wrong current passwords on POST /api/auth/password", async () => {
    const small = makeTestApp({ login: { ...limits, perAccountAddress: 3 } });
    const a = await small.agentAs(["viewer"]);
    const codes: number[] = [];
    for (let i = 0; i < 4; i++) {
      codes.push(
        (
          await a
            .post("/api/auth/password")
            .set("X-CSRF-Token", a.csrf)
            .send({ currentPassword: "wrong-one", newPassword: "brand-new-pass-1" })
        ).status,
      );
    }
    expect(codes).toEqual([400, 400, 400, 429]);
  }, 60_000);
});

describe("password change and deactivation end sessions and tokens", () => {
  const { app, agentAs, signIn } = makeTestApp();
  const sid = (setCookie: unknown) => /rw\.sid=([^;]+)/.exec(String(setCookie))?.[1];

  it("a password change gives the session a new id and revokes the user's tokens", async () => {
    const a = await agentAs(["infra"]);
    const other = await signIn(a.user!);
    const token = (await a.post("/api/tokens").set("X-CSRF-Token", a.csrf).send({ name: "job" }).expect(201)).body
      .token as string;
    const login = await signIn(a.user!);
    // rolling sessions re-send the cookie on every answer, so this names the current id
    const oldSid = sid((await login.get("/api/auth/session")).headers["set-cookie"]);
    expect(oldSid).toBeTruthy();
    const changed = await login
      .post("/api/auth/password")
      .set("X-CSRF-Token", login.csrf)
      .send({ currentPassword: a.user!.password, newPassword: "another-long-pass-7" });
    expect(changed.status).toBe(204);
    expect(changed.headers["cache-control"]).toBe("no-store");
    const newSid = sid(changed.headers["set-cookie"]);
    expect(newSid).toBeTruthy();
    expect(newSid).not.toBe(oldSid);
    // The changing session continues (new id, same CSRF token); the copied old cookie does not.
    expect((await login.get("/api/auth/session")).body.user?.id).toBe(a.user!.id);
    expect((await request(app).get("/api/auth/session").set("Cookie", `rw.sid=${oldSid}`)).body.user).toBeNull();
    expect((await other.get("/api/auth/session")).body.user).toBeNull();
    expect((await request(app).get("/api/plans").set("Authorization", `Bearer ${token}`)).status).toBe(401);
    const audit = await testDb().pool.query(
      "SELECT detail FROM audit_events WHERE action = 'user.password_changed' AND subject_id = $1",
      [String(a.user!.id)],
    );
    expect(audit.rows[0].detail).toMatchObject({ tokensRevoked: 1 });
  });

  it("deactivation revokes tokens for good: reactivation does not bring them back", async () => {
    const admin = await agentAs(["admin"]);
    const user = await agentAs(["viewer"]);
    const token = (await user.post("/api/tokens").set("X-CSRF-Token", user.csrf).send({ name: "ci" }).expect(201)).body
      .token as string;
    expect((await request(app).get("/api/plans").set("Authorization", `Bearer ${token}`)).status).toBe(200);
    await admin
      .patch(`/api/users/${user.user!.id}`)
      .set("X-CSRF-Token", admin.csrf)
      .send({ active: false })
      .expect(200);
    await admin.patch(`/api/users/${user.user!.id}`).set("X-CSRF-Token", admin.csrf).send({ active: true }).expect(200);
    expect((await request(app).get("/api/plans").set("Authorization", `Bearer ${token}`)).status).toBe(401);
    const rows = await testDb().pool.query("SELECT revoked_at FROM api_tokens WHERE user_id = $1", [user.user!.id]);
    expect(rows.rows.every((r) => r.revoked_at !== null)).toBe(true);
  });

  it("sends Cache-Control: no-store on token creation and auth answers", async () => {
    const a = await agentAs(["viewer"]);
    const created = await a.post("/api/tokens").set("X-CSRF-Token", a.csrf).send({ name: "n" }).expect(201);
    expect(created.headers["cache-control"]).toBe("no-store");
    expect((await a.get("/api/auth/session")).headers["cache-control"]).toBe("no-store");
    const user = await createTestUser(["viewer"]);
    const fresh = await makeTestApp().agent();
    const login = await fresh.post("/api/auth/login").set("X-CSRF-Token", fresh.csrf).send(user).expect(200);
    expect(login.headers["cache-control"]).toBe("no-store");
  });
});
