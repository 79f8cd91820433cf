/**
 * The API document against what Express really mounted: the router stack is walked independently of the route
 * definitions, so a route mounted by hand (or a definition not mounted) fails here.
 */
import request from "supertest";
import type { Express } from "express";
import { describe, expect, it } from "vitest";
import { makeTestApp } from "../setup/app";

const { app, agentAs } = makeTestApp();

interface Layer {
  route?: { path: string; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
  rawPath?: unknown;
}

/** "get /api/plans/{id}" for every route layer under /api, found by walking Express's own router stack. */
function mountedRoutes(express: Express): Set<string> {
  const out = new Set<string>();
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        const path = `${prefix}${layer.route.path}`.replace(/\/$/, "").replace(/:(\w+)/g, "{$1}");
        for (const m of Object.keys(layer.route.methods)) out.add(`${m} ${path}`);
      } else if (layer.handle?.stack && typeof layer.rawPath === "string") {
        walk(layer.handle.stack, prefix + (layer.rawPath === "/" ? "" : layer.rawPath));
      }
    }
  };
  walk((express as unknown as { router: { stack: Layer[] } }).router.stack, "");
  return new Set([...out].filter((r) => r.split(" ")[1].startsWith("/api")));
}

type Operation = { responses: Record<string, { content?: Record<string, { schema?: object }> }> };
async function documented() {
  const r = await request(app).get("/api/openapi.json").expect(200);
  expect(r.body.openapi).toMatch(/^3\./);
  const ops = new Map<string, Operation>();
  for (const [path, methods] of Object.entries(r.body.paths as Record<string, Record<string, Operation>>)) {
    for (const [m, op] of Object.entries(methods)) ops.set(`${m} ${path}`, op);
  }
  return { doc: r.body, ops };
}

describe("GET /api/openapi.json against the mounted routes", () => {
  it("documents exactly the routes Express mounted under /api, and no other", async () => {
    const { ops } = await documented();
    const mounted = mountedRoutes(app);
    expect(mounted.size).toBeGreaterThan(40);
    expect(
      [...mounted].filter((k) => !ops.has(k)),
      "mounted but not documented",
    ).toEqual([]);
    expect(
      [...ops.keys()].filter((k) => !mounted.has(k)),
      "documented but not mounted",
    ).toEqual([]);
  });

  it("gives every operation a documented success response: a JSON schema, another media type, or an empty 204", async () => {
    const { ops } = await documented();
    for (const [key, op] of ops) {
      const ok = Object.entries(op.responses).filter(([s]) => /^2\d\d$/.test(s));
      expect(ok.length, `${key} has a 2xx response`).toBeGreaterThan(0);
      for (const [status, res] of ok) {
        if (status === "204") continue;
        const types = Object.keys(res.content ?? {});
        expect(types.length, `${key} ${status} names its content`).toBeGreaterThan(0);
        if (types.includes("application/json"))
          expect(res.content!["application/json"].schema, `${key} ${status} schema`).toBeTruthy();
      }
    }
  });

  it("carries request bodies from the shared schemas and the export contract pipelines read", async () => {
    const { doc } = await documented();
    expect(JSON.stringify(doc.paths["/api/auth/login"].post.requestBody.content["application/json"].schema)).toContain(
      "password",
    );
    expect(JSON.stringify(doc.paths["/api/plans"].post.requestBody.content["application/json"].schema)).toContain(
      "targetContext",
    );
    const exported = JSON.stringify(
      doc.paths["/api/plans/{id}/approved/export"].get.responses["200"].content["application/json"].schema,
    );
    for (const field of ["signedBy", "contentHash", "attentionFactor", "caution"]) expect(exported).toContain(field);
    expect(Object.keys(doc.paths["/api/plans/{id}/revisions/{n}/report"].get.responses["200"].content)).toEqual([
      "text/html",
    ]);
    expect(Object.keys(doc.paths["/api/bounds/base/stream"].post.responses["200"].content)).toEqual([
      "text/event-stream",
    ]);
  });

  it("lists no GET route the server does not answer (each answers something other than the JSON 404)", async () => {
    const { ops } = await documented();
    const a = await agentAs(["admin"]);
    for (const key of [...ops.keys()].filter((k) => k.startsWith("get "))) {
      const path = key.slice(4).replace("{id}", "1").replace("{n}", "1").replace("{a}", "1").replace("{b}", "2");
      const res = await a.get(path);
      const unknownRoute = res.status === 404 && res.body?.error?.message === "no such API route";
      expect(unknownRoute, path).toBe(false);
    }
  });
});
