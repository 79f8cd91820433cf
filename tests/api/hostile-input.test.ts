/**
 * The hostile inputs a fuzz run answered with 500, one by one, with the answer and the stored state each must give:
 * a 400 naming the field and nothing written; a config.json with a byte-order mark imports.
 */
import { describe, expect, it } from "vitest";
import request from "supertest";
import { makeTestApp, type Agent } from "../setup/app";
import { testDb } from "../setup/db";
import { createPlan, createProfile, post, put } from "../setup/plans";
import { sampleProfile } from "../fixtures/profiles";
import { deepJson } from "../setup/fuzz";
import { MAX_JSON_DEPTH } from "../../server/platform/hostile";

const { app, agentAs } = makeTestApp();
const plain = {
  _name_or_path: "saltmarsh/heron-1b",
  model_type: "heron",
  hidden_size: 2048,
  num_attention_heads: 16,
  num_hidden_layers: 22,
  max_position_embeddings: 4096,
  rope_theta: 10000,
};
const upload = (a: Agent, text: string, query = "") =>
  a
    .post(`/api/models/import${query}`)
    .set("X-CSRF-Token", a.csrf)
    .attach("file", Buffer.from(text, "utf8"), "config.json");
const profileCount = async () =>
  (await testDb().pool.query("SELECT count(*)::int AS n FROM model_profiles")).rows[0].n as number;

function expectField(r: request.Response, field: string) {
  expect(r.status, JSON.stringify(r.body).slice(0, 300)).toBe(400);
  expect(Object.keys(r.body.error.fields ?? {}), JSON.stringify(r.body)).toContain(field);
}

describe("ids beyond a 32-bit integer", () => {
  it("answer 400 naming the path, query or body field", async () => {
    const a = await agentAs(["researcher"]);
    expectField(await a.get("/api/models/2147483648"), "id");
    expectField(await a.get("/api/plans?ownerId=2147483648"), "ownerId");
    expectField(await a.get("/api/plans/1/revisions/2147483648"), "n");
    expectField(
      await post(a, "/api/analyses", {
        model: { modelId: 2 ** 31 },
        targetContext: 8192,
        methods: [{ method: "yarn" }],
      }),
      "model.modelId",
    );
    // The largest int4 is a valid id that names no row.
    expect((await a.get("/api/models/2147483647")).status).toBe(404);
  });
});

describe("NUL characters", () => {
  it("are refused in body strings, keys and query strings before PostgreSQL sees them, and nothing is stored", async () => {
    const a = await agentAs(["researcher"]);
    const before = await profileCount();
    expectField(await post(a, "/api/models", sampleProfile({ family: "gan\u0000net" })), "family");
    const raw = { rope_type: "yarn", factor: 2, "k\u0000": 1 };
    expectField(
      await post(a, "/api/models", sampleProfile({ currentScaling: { method: "yarn", params: {}, raw } })),
      "currentScaling.raw.k\\u0000",
    );
    expect(await profileCount()).toBe(before);
    expectField(await a.get("/api/plans?q=a%00b"), "q");
  });
});

describe("JSON nested deeper than the limit", () => {
  it(`is refused in a body (limit ${MAX_JSON_DEPTH}) before anything is stored, and the list of profiles still reads`, async () => {
    const a = await agentAs(["researcher"]);
    const before = await profileCount();
    const body = JSON.stringify(
      sampleProfile({ currentScaling: { method: "yarn", params: {}, raw: "@deep@" } }),
    ).replace('"@deep@"', deepJson());
    const r = await a
      .post("/api/models")
      .set("X-CSRF-Token", a.csrf)
      .set("Content-Type", "application/json")
      .send(body);
    expectField(r, "currentScaling.raw.a");
    expect(r.body.error.fields["currentScaling.raw.a"]).toContain(`deeper than ${MAX_JSON_DEPTH}`);
    expect(await profileCount()).toBe(before);
    expect((await a.get("/api/models")).status).toBe(200);
  });

  it("a too-deep scaling block stored before the limit existed no longer breaks GET /api/models", async () => {
    const a = await agentAs(["researcher"]);
    const model = await createProfile(a);
    await testDb().pool.query("UPDATE model_profiles SET current_scaling = $1::jsonb WHERE id = $2", [
      deepJson(),
      model.id,
    ]);
    const list = await a.get(`/api/models?q=${encodeURIComponent(model.name)}`);
    expect(list.status, JSON.stringify(list.body).slice(0, 300)).toBe(200);
    const stored = list.body.models.find((m: { id: number }) => m.id === model.id);
    expect(stored.currentScaling).toBeNull();
    expect(stored.importWarnings.map((w: { code: string }) => w.code)).toContain("scaling_unreadable");
    expect((await a.get(`/api/models/${model.id}`)).status).toBe(200);
  });

  it("accepts nesting up to the limit", async () => {
    const a = await agentAs(["researcher"]);
    // The body is level 1 and currentScaling level 2, so raw may hold MAX_JSON_DEPTH − 2 levels of objects.
    const raw = JSON.parse(deepJson(MAX_JSON_DEPTH - 2));
    const r = await post(a, "/api/models", sampleProfile({ currentScaling: { method: "yarn", params: {}, raw } }));
    expect(r.status, JSON.stringify(r.body).slice(0, 300)).toBe(201);
  });

  it("is refused in an imported file and in its overrides field", async () => {
    const a = await agentAs(["researcher"]);
    const before = await profileCount();
    const deepFile = JSON.stringify({ ...plain, rope_scaling: "@deep@" }).replace('"@deep@"', deepJson());
    expectField(await upload(a, deepFile, "?save=true"), "file");
    const ok = JSON.stringify({ ...plain, _name_or_path: `x/heron-${Date.now()}` });
    const deepOverrides = JSON.stringify({ currentScaling: "@deep@" }).replace('"@deep@"', deepJson());
    const r = await a
      .post("/api/models/import")
      .set("X-CSRF-Token", a.csrf)
      .field("save", "true")
      .field("overrides", deepOverrides)
      .attach("file", Buffer.from(ok), "config.json");
    expectField(r, "overrides.currentScaling.a.a");
    const notObject = await a
      .post("/api/models/import")
      .set("X-CSRF-Token", a.csrf)
      .field("overrides", "[1,2]")
      .attach("file", Buffer.from(ok), "config.json");
    expectField(notObject, "overrides");
    expectField(await upload(a, JSON.stringify({ ...plain, model_type: "her\u0000on" })), "file");
    expect(await profileCount()).toBe(before);
  });
});

describe("config.json import", () => {
  it("reads a file that starts with a UTF-8 byte-order mark (RFC 8259 §8.1 lets parsers ignore it)", async () => {
    const a = await agentAs(["researcher"]);
    const text = `\uFEFF${JSON.stringify({ ...plain, _name_or_path: `x/heron-bom-${Date.now()}` })}`;
    expect(Buffer.from(text, "utf8").subarray(0, 3)).toEqual(Buffer.from([0xef, 0xbb, 0xbf]));
    const r = await upload(a, text, "?save=true");
    expect(r.status, JSON.stringify(r.body).slice(0, 300)).toBe(201);
    expect(r.body.saved).toMatchObject({ headDim: 128, hiddenSize: 2048, trainedContext: 4096 });
  });

  for (const type of ["constructor", "__proto__", "hasOwnProperty", "toString"]) {
    it(`treats rope_type "${type}" as an unknown method, not as a member of Object`, async () => {
      const a = await agentAs(["researcher"]);
      const r = await upload(
        a,
        JSON.stringify({
          ...plain,
          torch_dtype: type,
          rope_scaling: { rope_type: type, factor: 2, original_max_position_embeddings: 2048 },
        }),
      );
      expect(r.status, JSON.stringify(r.body).slice(0, 300)).toBe(200);
      expect(r.body.warnings.map((w: { code: string }) => w.code)).toContain("unknown_rope_type");
      expect(r.body.profile.currentScaling.method).toBe(type);
      expect(r.body.profile.bytesPerElement).toBe(2);
    });
  }
});

describe("numbers at the edge of a double", () => {
  it("refuses a denormal peak FLOP/s on an accelerator and in a plan's budget, naming the field", async () => {
    const a = await agentAs(["researcher", "infra"]);
    expectField(
      await post(a, "/api/accelerators", {
        name: `Skiff-${Date.now()}`,
        memoryBytes: 80e9,
        peakFlops: 5e-324,
        pricePerHour: 2,
      }),
      "peakFlops",
    );
    const model = await createProfile(a);
    const plan = await createPlan(a, model.id);
    const budget = { cluster: { peakFlops: 5e-324, memoryBytes: 80e9, pricePerHour: 2 }, accelerators: 8 };
    expectField(await put(a, `/api/plans/${plan.id}/revisions/1`, { version: 1, budget }), "budget.cluster.peakFlops");
    expectField(
      await put(a, `/api/plans/${plan.id}/revisions/1`, {
        version: 1,
        budget: { ...budget, cluster: { ...budget.cluster, peakFlops: 1e15 }, utilization: 5e-324 },
      }),
      "budget.utilization",
    );
  });
});

describe("a bearer token on GET /api/auth/session", () => {
  it("answers a 4xx (the token's scopes refuse it, or 400 naming the authorization header), never 500", async () => {
    const a = await agentAs(["viewer"]);
    const created = await post(a, "/api/tokens", { name: "session probe" }).expect(201);
    const r = await request(app).get("/api/auth/session").set("Authorization", `Bearer ${created.body.token}`);
    expect([400, 403], JSON.stringify(r.body)).toContain(r.status);
    if (r.status === 400) expectField(r, "authorization");
    else expect(r.body.error.code).toBe("token_scope");
  });
});
