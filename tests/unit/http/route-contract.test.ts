/**
 * The route helper's own promises, on a bare Express app (no database): a handler's JSON is checked against the
 * declared schema outside production (a 500 in tests, a log line in development), parsed input reaches the handler,
 * and a declared 204 sends no body.
 */
import express from "express";
import request from "supertest";
import { z } from "zod";
import { afterEach, describe, expect, it, vi } from "vitest";
import type { NextFunction, Request, Response } from "express";
import { mountFeature, ResponseMismatch, route, type ApiFeature } from "../../../server/http/route";
import { AppError } from "../../../server/platform/errors";
import { httpStatusOf } from "../../../server/http/error-status";
import type { AppDeps } from "../../../server/deps";
import { PreparedJson } from "../../../server/platform/prepared-json";

const thing = z.object({ id: z.number(), state: z.enum(["draft", "approved"]) });

/** A feature whose second route lies about its answer, as a plan route did when `state` was any string. */
const feature: ApiFeature = {
  prefix: "/things",
  tag: "test",
  routes: [
    route({
      method: "get",
      path: "/:id",
      summary: "one",
      access: "public",
      params: z.object({ id: z.coerce.number().int() }),
      responses: { 200: thing },
      handler: ({ params }) => ({ status: 200, body: { id: params.id, state: "draft" as const } }),
    }),
    route({
      method: "get",
      path: "/:id/drifted",
      summary: "drifted",
      access: "public",
      responses: { 200: thing },
      // The compiler would refuse `state: "lost"` here; the cast stands for data that escaped the types (a raw SQL row).
      handler: () => ({ status: 200, body: { id: 1, state: "lost" as "draft" } }),
    }),
    route({
      method: "get",
      path: "/:id/prepared-drifted",
      summary: "prepared, drifted",
      access: "public",
      responses: { 200: thing },
      // The same lie, sent as prepared bytes (a kept answer): checked all the same.
      handler: () => ({ status: 200, prepared: new PreparedJson({ id: 1, state: "lost" as "draft" }) }),
    }),
    route({
      method: "delete",
      path: "/:id",
      summary: "gone",
      access: "public",
      responses: { 204: { contentType: null, description: "gone" } },
      handler: () => ({ status: 204, raw: null }),
    }),
  ],
};

let caught: unknown[] = [];
/** A bare error handler standing in for the app's (which needs the request logger): 4xx as usual, anything else 500. */
function appFor(env: "test" | "development" | "production") {
  const app = express();
  app.use(feature.prefix, mountFeature(feature, { config: { env } } as AppDeps));
  app.use((err: unknown, _req: Request, res: Response, _next: NextFunction) => {
    caught.push(err);
    if (err instanceof AppError)
      return res
        .status(httpStatusOf(err))
        .json({ error: { code: err.code, message: err.message, fields: err.fields } });
    res.status(500).json({ error: { code: "internal", message: "failed" } });
  });
  return app;
}

afterEach(() => {
  vi.restoreAllMocks();
  caught = [];
});

describe("route(): one definition for the Express route and its response contract", () => {
  it("passes parsed params to the handler and answers the declared status", async () => {
    const r = await request(appFor("test")).get("/things/7").expect(200);
    expect(r.body).toEqual({ id: 7, state: "draft" });
  });

  it("refuses bad params with a 400 naming the field, before the handler runs", async () => {
    const r = await request(appFor("test")).get("/things/seven").expect(400);
    expect(Object.keys(r.body.error.fields)).toEqual(["id"]);
  });

  it("fails a test-mode response that does not match its schema (500), naming the field", async () => {
    await request(appFor("test")).get("/things/1/drifted").expect(500);
    expect(caught[0]).toBeInstanceOf(ResponseMismatch);
    expect(String((caught[0] as Error).message)).toMatch(/state/);
  });

  it("checks prepared answers against the schema too (500 in tests) and sends them as plain JSON otherwise", async () => {
    await request(appFor("test")).get("/things/1/prepared-drifted").expect(500);
    expect(caught[0]).toBeInstanceOf(ResponseMismatch);
    const r = await request(appFor("production")).get("/things/1/prepared-drifted").expect(200);
    expect(r.headers["content-type"]).toMatch(/^application\/json/);
    expect(r.body).toEqual({ id: 1, state: "lost" });
  });

  it("in development logs the mismatch and still answers", async () => {
    const log = vi.spyOn(console, "error").mockImplementation(() => {});
    const r = await request(appFor("development")).get("/things/1/drifted").expect(200);
    expect(r.body.state).toBe("lost");
    expect(String(log.mock.calls[0]?.[0])).toMatch(/\[contract\].*state/);
  });

  it("does not check responses in production", async () => {
    const log = vi.spyOn(console, "error").mockImplementation(() => {});
    await request(appFor("production")).get("/things/1/drifted").expect(200);
    expect(log).not.toHaveBeenCalled();
  });

  it("sends a declared 204 without a body", async () => {
    const r = await request(appFor("test")).delete("/things/1").expect(204);
    expect(r.text).toBe("");
  });
});
