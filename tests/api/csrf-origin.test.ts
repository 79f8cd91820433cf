import request from "supertest";
import { describe, expect, it } from "vitest";
import { makeTestApp } from "../setup/app";
import { testDb } from "../setup/db";

const PUBLIC_URL = "https://ropewalk.example.test";
const { app, agent, agentAs } = makeTestApp({ publicUrl: PUBLIC_URL });

const tokensOf = async (userId: number) =>
  (await testDb().pool.query("SELECT count(*)::int AS n FROM api_tokens WHERE user_id = $1", [userId])).rows[0]
    .n as number;

describe("CSRF: only a real token exempts a request", () => {
  it("a malformed Bearer header next to a session cookie is refused and writes nothing", async () => {
    const a = await agentAs(["viewer"]);
    for (const header of ["Bearer a b", "Bearer", "Bearer  "]) {
      const r = await a.post("/api/tokens").set("Authorization", header).send({ name: "sneaky" });
      expect(r.status, header).toBe(401);
      expect(r.body.error.fields).toHaveProperty("authorization");
    }
    expect(await tokensOf(a.user!.id)).toBe(0);
  });

  it("an unknown token next to a session cookie is refused (401), not treated as the cookie's user", async () => {
    const a = await agentAs(["viewer"]);
    const r = await a.post("/api/tokens").set("Authorization", "Bearer rw_not-a-real-token").send({ name: "sneaky" });
    expect(r.status).toBe(401);
    expect(await tokensOf(a.user!.id)).toBe(0);
  });
});

describe("CSRF: where a cookie request comes from", () => {
  const create = (a: Awaited<ReturnType<typeof agentAs>>) => a.post("/api/tokens").set("X-CSRF-Token", a.csrf);

  it("refuses another site's Origin even with the right token", async () => {
    const a = await agentAs(["viewer"]);
    const r = await create(a).set("Origin", "https://evil.example.test").send({ name: "x" });
    expect(r.status).toBe(403);
    expect(r.body.error.code).toBe("csrf");
    expect((await create(a).set("Origin", "null").send({ name: "x" })).status).toBe(403);
    expect(await tokensOf(a.user!.id)).toBe(0);
  });

  it("refuses Sec-Fetch-Site cross-site and same-site when no Origin is sent", async () => {
    const a = await agentAs(["viewer"]);
    expect((await create(a).set("Sec-Fetch-Site", "cross-site").send({ name: "x" })).status).toBe(403);
    expect((await create(a).set("Sec-Fetch-Site", "same-site").send({ name: "x" })).status).toBe(403);
    expect(await tokensOf(a.user!.id)).toBe(0);
  });

  it("accepts our own origin, PUBLIC_URL, and (with the token) clients that send no Origin at all", async () => {
    const a = await agentAs(["viewer"]);
    // Supertest talks to an ephemeral 127.0.0.1 port; its Host header names it.
    const own = await create(a)
      .set("Origin", "http://own.example.test")
      .set("Host", "own.example.test")
      .send({ name: "own" });
    expect(own.status).toBe(201);
    expect((await create(a).set("Origin", PUBLIC_URL).send({ name: "public" })).status).toBe(201);
    expect((await create(a).set("Sec-Fetch-Site", "same-origin").send({ name: "fetch" })).status).toBe(201);
    expect((await create(a).send({ name: "no origin" })).status).toBe(201);
    // Without the token, a client without Origin is still refused.
    expect((await a.post("/api/tokens").send({ name: "no token" })).status).toBe(403);
    expect(await tokensOf(a.user!.id)).toBe(4);
  });
});

describe("anonymous visitors store nothing", () => {
  it("N anonymous GET /api/auth/session store 0 session rows and set no session cookie", async () => {
    const before = (await testDb().pool.query("SELECT count(*)::int AS n FROM session")).rows[0].n as number;
    const tokens: string[] = [];
    for (let i = 0; i < 25; i++) {
      const r = await request(app).get("/api/auth/session").expect(200);
      expect(String(r.headers["set-cookie"] ?? "")).not.toMatch(/rw\.sid=/);
      expect(r.headers["cache-control"]).toBe("no-store");
      tokens.push(r.body.csrfToken);
    }
    expect(new Set(tokens).size).toBe(25);
    const stored = await testDb().pool.query(
      "SELECT count(*)::int AS n FROM session WHERE sess->>'csrfToken' = ANY($1)",
      [tokens],
    );
    expect(stored.rows[0].n).toBe(0);
    // Other files sign in concurrently, so the total may grow by their rows, never by 25 of ours.
    const after = (await testDb().pool.query("SELECT count(*)::int AS n FROM session")).rows[0].n as number;
    expect(after - before).toBeLessThan(25);
  });

  it("the cookie token survives repeated GETs and is what sign-in checks", async () => {
    const a = await agent();
    const again = await a.get("/api/auth/session").expect(200);
    expect(again.body.csrfToken).toBe(a.csrf);
    const wrong = await a
      .post("/api/auth/login")
      .set("X-CSRF-Token", "made-up")
      .send({ email: "x@example.test", password: "whatever-1" });
    expect(wrong.status).toBe(403);
  });

  it("a forged unsigned cookie token is refused", async () => {
    const r = await request(app)
      .post("/api/auth/login")
      .set("Cookie", "rw.csrf=forged")
      .set("X-CSRF-Token", "forged")
      .send({ email: "x@example.test", password: "whatever-1" });
    expect(r.status).toBe(403);
    expect(r.body.error.code).toBe("csrf");
  });
});
