import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { ROLES } from "../../shared/schemas";
import { makeTestApp } from "../setup/app";
import { testDb } from "../setup/db";
import { sampleProfile } from "../fixtures/profiles";

const { agentAs } = makeTestApp();
const fixture = (n: string) => fs.readFileSync(path.join(import.meta.dirname, "../fixtures/configs", n));
const count = async () =>
  (await testDb().pool.query("SELECT count(*)::int AS n FROM model_profiles")).rows[0].n as number;
const uniq = () => Math.random().toString(36).slice(2, 8);

describe("model profiles", () => {
  it("creates, reads with derived rotary dimension, edits and deletes", async () => {
    const a = await agentAs(["researcher"]);
    const created = await a
      .post("/api/models")
      .set("X-CSRF-Token", a.csrf)
      .send(sampleProfile({ headDim: 64, partialRotaryFactor: 0.5 }))
      .expect(201);
    const m = created.body.model;
    expect(m).toMatchObject({ rotaryDim: 32, pairs: 16 });
    const got = await a.get(`/api/models/${m.id}`).expect(200);
    expect(got.body.model.name).toBe(m.name);
    const edited = await a
      .put(`/api/models/${m.id}`)
      .set("X-CSRF-Token", a.csrf)
      .send(sampleProfile({ name: m.name, ropeTheta: 500000 }))
      .expect(200);
    expect(edited.body.model.ropeTheta).toBe(500000);
    await a.delete(`/api/models/${m.id}`).set("X-CSRF-Token", a.csrf).expect(204);
    await a.get(`/api/models/${m.id}`).expect(404);
    const audit = await testDb().pool.query(
      "SELECT action FROM audit_events WHERE subject_type='model' AND subject_id=$1 ORDER BY id",
      [String(m.id)],
    );
    expect(audit.rows.map((r) => r.action)).toEqual(["model.created", "model.updated", "model.deleted"]);
  });

  for (const role of ROLES) {
    const may = ["researcher", "infra", "admin"].includes(role);
    it(`${role} ${may ? "may" : "may not"} create profiles; everyone reads`, async () => {
      const a = await agentAs([role]);
      const r = await a.post("/api/models").set("X-CSRF-Token", a.csrf).send(sampleProfile());
      expect(r.status).toBe(may ? 201 : 403);
      expect((await a.get("/api/models")).status).toBe(200);
      const imp = await a
        .post("/api/models/import")
        .set("X-CSRF-Token", a.csrf)
        .attach("file", fixture("plain-4k.json"), "config.json");
      expect(imp.status).toBe(may ? 200 : 403);
    });
  }

  const bad: [string, Record<string, unknown>, string][] = [
    ["odd rotary dimension", { headDim: 64, partialRotaryFactor: 0.3 }, "partialRotaryFactor"],
    ["rotary fraction above 1", { partialRotaryFactor: 1.5 }, "partialRotaryFactor"],
    ["rotary fraction 0", { partialRotaryFactor: 0 }, "partialRotaryFactor"],
    ["non-positive head dim", { headDim: -2 }, "headDim"],
    ["KV heads not dividing heads", { kvHeads: 5 }, "kvHeads"],
    ["length beyond 2^31", { trainedContext: 2 ** 31 + 1 }, "trainedContext"],
    ["base as text", { ropeTheta: "10000" }, "ropeTheta"],
  ];
  for (const [label, over, field] of bad) {
    it(`${label} → 400 naming ${field}, nothing written`, async () => {
      const a = await agentAs(["researcher"]);
      const before = await count();
      const r = await a.post("/api/models").set("X-CSRF-Token", a.csrf).send(sampleProfile(over));
      expect(r.status).toBe(400);
      expect(r.body.error.fields).toHaveProperty(field);
      expect(await count()).toBe(before);
    });
  }

  it("refuses a duplicate name with 409", async () => {
    const a = await agentAs(["infra"]);
    const p = sampleProfile();
    await a.post("/api/models").set("X-CSRF-Token", a.csrf).send(p).expect(201);
    const r = await a.post("/api/models").set("X-CSRF-Token", a.csrf).send(p);
    expect(r.status).toBe(409);
    expect(r.body.error.fields).toHaveProperty("name");
  });
});

describe("config.json import", () => {
  it("previews without saving, then saves with the file kept and the user's edits applied", async () => {
    const a = await agentAs(["researcher"]);
    const before = await count();
    const preview = await a
      .post("/api/models/import")
      .set("X-CSRF-Token", a.csrf)
      .attach("file", fixture("every-warning.json"), "config.json")
      .expect(200);
    expect(preview.body.saved).toBeNull();
    expect(preview.body.warnings.map((w: { code: string }) => w.code)).toContain("missing_original_length");
    expect(await count()).toBe(before);
    const name = `Troubled-${uniq()}`;
    const saved = await a
      .post("/api/models/import?save=true")
      .set("X-CSRF-Token", a.csrf)
      .field("overrides", JSON.stringify({ name, trainedContext: 4096, ropeTheta: 10000, parameters: 7e9 }))
      .attach("file", fixture("every-warning.json"), "troubled.json")
      .expect(201);
    expect(saved.body.saved).toMatchObject({
      name,
      trainedContext: 4096,
      rotaryDim: 128,
      sourceFileName: "troubled.json",
    });
    expect(saved.body.saved.currentScaling.method).toBe("yarn");
    expect(saved.body.saved.importWarnings.length).toBeGreaterThan(3);
    const src = await a.get(`/api/models/${saved.body.saved.id}/source`).expect(200);
    expect(src.text).toBe(fixture("every-warning.json").toString("utf8"));
  });

  it("a file that is not JSON → 400 naming file", async () => {
    const a = await agentAs(["researcher"]);
    const r = await a
      .post("/api/models/import")
      .set("X-CSRF-Token", a.csrf)
      .attach("file", fixture("broken.json"), "config.json");
    expect(r.status).toBe(400);
    expect(r.body.error.fields.file).toMatch(/JSON/);
  });

  it("a non-.json upload → 400; missing keys → 400 naming them; no file → 400", async () => {
    const a = await agentAs(["researcher"]);
    const txt = await a
      .post("/api/models/import")
      .set("X-CSRF-Token", a.csrf)
      .attach("file", Buffer.from("hello"), { filename: "notes.txt", contentType: "text/plain" });
    expect(txt.status).toBe(400);
    expect(txt.body.error.fields).toHaveProperty("file");
    const keys = await a
      .post("/api/models/import")
      .set("X-CSRF-Token", a.csrf)
      .attach("file", fixture("no-heads.json"), "config.json");
    expect(keys.status).toBe(400);
    expect(Object.keys(keys.body.error.fields).sort()).toEqual(["max_position_embeddings", "num_attention_heads"]);
    const none = await a.post("/api/models/import").set("X-CSRF-Token", a.csrf).field("save", "false");
    expect(none.status).toBe(400);
    expect(none.body.error.fields).toHaveProperty("file");
  });

  // The config import keeps its first contract ("JSON only, ≤1 MB, 413 above"); the evidence upload answers 400 (issue 12).
  it("an oversized file (over 1 MB) → 413 naming the file part, nothing written", async () => {
    const a = await agentAs(["researcher"]);
    const before = await count();
    const big = Buffer.from(JSON.stringify({ hidden_size: 1, pad: "x".repeat(1024 * 1024 + 10) }));
    const r = await a
      .post("/api/models/import?save=true")
      .set("X-CSRF-Token", a.csrf)
      .attach("file", big, "config.json");
    expect(r.status).toBe(413);
    expect(r.body.error).toMatchObject({ code: "too_large", fields: { file: "larger than 1 MB" } });
    expect(await count()).toBe(before);
  });
});
