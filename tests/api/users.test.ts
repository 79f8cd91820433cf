import { describe, expect, it } from "vitest";
import { makeTestApp } from "../setup/app";
import { testDb } from "../setup/db";

const { agentAs, deps } = makeTestApp();
const userCount = async () => (await testDb().pool.query("SELECT count(*)::int AS n FROM users")).rows[0].n as number;
const auditFor = async (id: number) =>
  (
    await testDb().pool.query(
      "SELECT action, detail FROM audit_events WHERE subject_type = 'user' AND subject_id = $1 ORDER BY id",
      [String(id)],
    )
  ).rows;

describe("user administration", () => {
  it("creates a user with two roles, lists, changes roles, deactivates — each recorded", async () => {
    const admin = await agentAs(["admin"]);
    const email = `new-${Date.now()}@example.test`;
    const created = await admin
      .post("/api/users")
      .set("X-CSRF-Token", admin.csrf)
      .send({ email, name: "Wren Achterberg", password: "long-enough-pass", roles: ["researcher", "infra"] })
      .expect(201);
    expect(created.body.user).toMatchObject({ email, roles: ["researcher", "infra"], active: true });
    expect(created.body.user).not.toHaveProperty("passwordHash");
    const list = await admin.get(`/api/users?q=${encodeURIComponent(email)}`).expect(200);
    expect(list.body.users.some((u: { email: string }) => u.email === email)).toBe(true);
    const id = created.body.user.id;
    await admin
      .patch(`/api/users/${id}`)
      .set("X-CSRF-Token", admin.csrf)
      .send({ roles: ["approver"] })
      .expect(200);
    await admin.patch(`/api/users/${id}`).set("X-CSRF-Token", admin.csrf).send({ active: false }).expect(200);
    const actions = (await auditFor(id)).map((r) => r.action);
    expect(actions).toEqual(["user.created", "user.roles_changed", "user.deactivated"]);
    const stored = await testDb().pool.query("SELECT password_hash FROM users WHERE id = $1", [id]);
    // bcrypt's modular-crypt form $2b$<cost>$ (Provos & Mazières 1999); tests run at the configured lower cost
    expect(stored.rows[0].password_hash).toMatch(new RegExp(`^\\$2[aby]\\$0?${deps.config.bcryptCost}\\$`));
  });

  it("refuses a taken e-mail with 409 and writes nothing", async () => {
    const admin = await agentAs(["admin"]);
    const before = await userCount();
    const r = await admin
      .post("/api/users")
      .set("X-CSRF-Token", admin.csrf)
      .send({ email: admin.user!.email, name: "Dup", password: "long-enough-pass", roles: ["viewer"] });
    expect(r.status).toBe(409);
    expect(r.body.error.fields).toHaveProperty("email");
    expect(await userCount()).toBe(before);
  });

  it("answers 404 for an unknown user", async () => {
    const admin = await agentAs(["admin"]);
    const r = await admin.patch("/api/users/99999999").set("X-CSRF-Token", admin.csrf).send({ name: "Nobody" });
    expect(r.status).toBe(404);
    expect(r.body.error.code).toBe("not_found");
  });
});

describe("bad input never reaches the database", () => {
  const cases: [string, string | object, string][] = [
    ["malformed JSON", '{"email": "a@b.test", ', "(body)"],
    ["missing fields", {}, "email"],
    ["wrong types", { email: 42, name: ["x"], password: true, roles: "admin" }, "roles"],
    [
      "unknown role",
      { email: "r@example.test", name: "R", password: "long-enough-pass", roles: ["wizard"] },
      "roles.0",
    ],
    ["short password", { email: "p@example.test", name: "P", password: "short", roles: ["viewer"] }, "password"],
    ["bad e-mail", { email: "not-an-email", name: "E", password: "long-enough-pass", roles: ["viewer"] }, "email"],
  ];
  for (const [label, body, field] of cases) {
    it(`${label} → 400 naming ${field}`, async () => {
      const admin = await agentAs(["admin"]);
      const before = await userCount();
      const req = admin.post("/api/users").set("X-CSRF-Token", admin.csrf).set("Content-Type", "application/json");
      const r = await req.send(typeof body === "string" ? body : JSON.stringify(body));
      expect(r.status).toBe(400);
      expect(r.body.error.fields).toHaveProperty(field);
      expect(JSON.stringify(r.body)).not.toMatch(/at .*\.ts:\d+/); // no stack trace
      expect(await userCount()).toBe(before);
    });
  }

  it("a huge body → 413 and nothing written", async () => {
    const admin = await agentAs(["admin"]);
    const before = await userCount();
    const r = await admin
      .post("/api/users")
      .set("X-CSRF-Token", admin.csrf)
      .send({
        email: "big@example.test",
        name: "x".repeat(2_000_000),
        password: "long-enough-pass",
        roles: ["viewer"],
      });
    expect(r.status).toBe(413);
    expect(r.body.error.code).toBe("too_large");
    expect(await userCount()).toBe(before);
  });

  it("an empty role list and a no-op patch are refused", async () => {
    const admin = await agentAs(["admin"]);
    const r1 = await admin.patch(`/api/users/${admin.user!.id}`).set("X-CSRF-Token", admin.csrf).send({ roles: [] });
    expect(r1.status).toBe(400);
    expect(r1.body.error.fields).toHaveProperty("roles");
    const r2 = await admin.patch(`/api/users/${admin.user!.id}`).set("X-CSRF-Token", admin.csrf).send({});
    expect(r2.status).toBe(400);
  });

  it("unknown API routes answer 404 in JSON", async () => {
    const a = await agentAs(["viewer"]);
    const r = await a.get("/api/no-such-thing");
    expect(r.status).toBe(404);
    expect(r.body.error.code).toBe("not_found");
  });
});
