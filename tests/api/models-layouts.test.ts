import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { importResponseSchema, modelProfileSchema } from "../../shared/schemas/models";
import { makeTestApp } from "../setup/app";
import { testDb } from "../setup/db";
import { sampleProfile } from "../fixtures/profiles";

/* Import of the layouts shipped since 2024 through the API: refusals, previews, and what a saved profile keeps. */
const { agentAs } = makeTestApp();
const fixture = (n: string) => fs.readFileSync(path.join(import.meta.dirname, "../fixtures/configs", n));
const count = async () =>
  (await testDb().pool.query("SELECT count(*)::int AS n FROM model_profiles")).rows[0].n as number;
const uniq = () => Math.random().toString(36).slice(2, 8);

describe("import of model layouts", () => {
  it("a model with learned absolute positions → 400 not_rotary naming the scheme and the key; nothing saved", async () => {
    const a = await agentAs(["researcher"]);
    const before = await count();
    const r = await a
      .post("/api/models/import?save=true")
      .set("X-CSRF-Token", a.csrf)
      .attach("file", fixture("learned-absolute.json"), "config.json")
      .expect(400);
    expect(r.body.error.code).toBe("not_rotary");
    expect(r.body.error.message).toMatch(/learned absolute positions/);
    expect(r.body.error.fields).toEqual({ position_embedding_type: 'position_embedding_type is "absolute"' });
    expect(await count()).toBe(before);
  });

  it("previews a latent-attention config with the client's schema: rotaryDim 64, kvLatentDim 576", async () => {
    const a = await agentAs(["researcher"]);
    const r = await a
      .post("/api/models/import")
      .set("X-CSRF-Token", a.csrf)
      .attach("file", fixture("latent-attention-yarn.json"), "config.json")
      .expect(200);
    expect(importResponseSchema.safeParse(r.body).success).toBe(true);
    expect(r.body.profile).toMatchObject({ rotaryDim: 64, kvLatentDim: 576, mropeSection: null });
  });

  it("saves a layered model with its groups; GET returns them, the scaled group following the top level", async () => {
    const a = await agentAs(["researcher"]);
    const name = `Windowed-${uniq()}`;
    const saved = await a
      .post("/api/models/import?save=true")
      .set("X-CSRF-Token", a.csrf)
      .field("overrides", JSON.stringify({ name, parameters: 3e9 }))
      .attach("file", fixture("sliding-full-local-base.json"), "config.json")
      .expect(201);
    const got = await a.get(`/api/models/${saved.body.saved.id}`).expect(200);
    const profile = modelProfileSchema.parse(got.body.model);
    expect(
      profile.layerGroups.map((g) => [g.kind, g.layers.length, g.ropeTheta, g.currentScaling?.method ?? null]),
    ).toEqual([
      ["sliding_attention", 10, 10_000, null],
      ["full_attention", 2, 1e6, "linear"],
    ]);
    // An edit of the top-level base moves the scaled group with it and leaves the local layers as trained.
    const {
      id: _id,
      rotaryDim: _r,
      pairs: _p,
      sourceFileName: _s,
      retiredAt: _ra,
      importWarnings: _w,
      createdBy: _c,
      createdAt: _ca,
      updatedAt: _u,
      ...input
    } = profile;
    const put = await a
      .put(`/api/models/${profile.id}`)
      .set("X-CSRF-Token", a.csrf)
      .send({ ...input, ropeTheta: 2e6 })
      .expect(200);
    const after = modelProfileSchema.parse(put.body.model).layerGroups;
    expect(after.map((g) => g.ropeTheta)).toEqual([10_000, 2e6]);
  });

  it("a profile entered by hand is one full_attention group over its layers", async () => {
    const a = await agentAs(["researcher"]);
    const r = await a.post("/api/models").set("X-CSRF-Token", a.csrf).send(sampleProfile()).expect(201);
    const p = modelProfileSchema.parse(r.body.model);
    expect(p.layerGroups).toEqual([
      {
        kind: "full_attention",
        layers: Array.from({ length: 32 }, (_, i) => i),
        ropeTheta: 10000,
        rotaryDim: 128,
        slidingWindow: null,
        currentScaling: null,
      },
    ]);
    expect(p).toMatchObject({ mropeSection: null, mropeInterleaved: false, kvLatentDim: null });
  });

  it("a group naming a layer the model does not have → 400 on that field", async () => {
    const a = await agentAs(["researcher"]);
    const group = {
      kind: "full_attention",
      layers: [0, 40],
      ropeTheta: 1e4,
      rotaryDim: 128,
      slidingWindow: null,
      currentScaling: null,
    };
    const r = await a
      .post("/api/models")
      .set("X-CSRF-Token", a.csrf)
      .send(sampleProfile({ layerGroups: [group] }))
      .expect(400);
    expect(Object.keys(r.body.error.fields)).toContain("layerGroups.0.layers");
  });
});
