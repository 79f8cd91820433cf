import { describe, expect, it } from "vitest";
import request from "supertest";
import { ROLES, type Role } from "../../shared/schemas";
import { makeTestApp, type Agent } from "../setup/app";

const { app, agentAs } = makeTestApp();

type Call = { name: string; send: (a: Agent) => request.Test; allowed: Role[] | "any" };
const body = () => ({
  email: `m-${Math.random().toString(36).slice(2)}@example.test`,
  name: "Matrix",
  password: "long-enough-pass",
  roles: ["viewer"],
});

// Every route of the foundation × every role → expected status.
const CALLS: Call[] = [
  { name: "GET /api/users", send: (a) => a.get("/api/users"), allowed: ["admin"] },
  {
    name: "POST /api/users",
    send: (a) => a.post("/api/users").set("X-CSRF-Token", a.csrf).send(body()),
    allowed: ["admin"],
  },
  {
    name: "PATCH /api/users/:id",
    send: (a) => a.patch(`/api/users/${a.user!.id}`).set("X-CSRF-Token", a.csrf).send({ name: "Renamed" }),
    allowed: ["admin"],
  },
  { name: "GET /api/auth/session", send: (a) => a.get("/api/auth/session"), allowed: "any" },
  {
    name: "POST /api/auth/password",
    send: (a) =>
      a
        .post("/api/auth/password")
        .set("X-CSRF-Token", a.csrf)
        .send({ currentPassword: a.user!.password, newPassword: "another-pass-99" }),
    allowed: "any",
  },
  { name: "GET /api/health", send: (a) => a.get("/api/health"), allowed: "any" },
];

const okStatus: Record<string, number> = {
  "POST /api/users": 201,
  "POST /api/auth/password": 204,
};

describe("role matrix: foundation routes", () => {
  for (const call of CALLS) {
    for (const role of ROLES) {
      const allowed = call.allowed === "any" || call.allowed.includes(role);
      const expected = allowed ? (okStatus[call.name] ?? 200) : 403;
      it(`${call.name} as ${role} → ${expected}`, async () => {
        const a = await agentAs([role]);
        const r = await call.send(a);
        expect(r.status).toBe(expected);
      });
    }
  }

  it("signed-out callers get 401 on protected routes", async () => {
    expect((await request(app).get("/api/users")).status).toBe(401);
    expect((await request(app).get("/api/users")).body.error.code).toBe("unauthorized");
  });
});
