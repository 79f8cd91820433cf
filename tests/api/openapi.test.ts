import request from "supertest";
import { describe, expect, it } from "vitest";
import { makeTestApp } from "../setup/app";
import { ROUTES } from "../../server/openapi";

const { app, agentAs } = makeTestApp();

describe("GET /api/openapi.json", () => {
  it("describes every route in OpenAPI 3, with request bodies from the shared schemas", async () => {
    const r = await request(app).get("/api/openapi.json").expect(200);
    expect(r.body.openapi).toMatch(/^3\./);
    for (const route of ROUTES) expect(r.body.paths[route.path]?.[route.method], `${route.method} ${route.path}`).toBeDefined();
    const login = r.body.paths["/api/auth/login"].post.requestBody.content["application/json"].schema;
    expect(JSON.stringify(login)).toContain("password");
    const plans = JSON.stringify(r.body.paths["/api/plans"].post.requestBody.content["application/json"].schema);
    expect(plans).toContain("targetContext");
  });

  it("lists no route the server does not answer (each documented route answers something other than the JSON 404)", async () => {
    const a = await agentAs(["admin"]);
    for (const route of ROUTES.filter((x) => x.method === "get")) {
      const path = route.path.replace("{id}", "1").replace("{n}", "1").replace("{a}", "1").replace("{b}", "2");
      const res = await a.get(path);
      const unknownRoute = res.status === 404 && res.body?.error?.message === "no such API route";
      expect(unknownRoute, path).toBe(false);
    }
  });
});
