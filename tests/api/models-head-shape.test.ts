import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { importResponseSchema } from "../../shared/schemas/models";
import { makeTestApp } from "../setup/app";
import { testDb } from "../setup/db";

/*
 * A config whose hidden_size does not split evenly over its heads (4096 / 30 = 136.53…) and whose 7 key/value heads
 * do not divide its 30 query heads. The preview must still render (the client parses it with the shared schema),
 * each problem is a warning with a fix, and saving waits for head_dim.
 */
const { agentAs } = makeTestApp();
const fixture = (n: string) => fs.readFileSync(path.join(import.meta.dirname, "../fixtures/configs", n));
const count = async () =>
  (await testDb().pool.query("SELECT count(*)::int AS n FROM model_profiles")).rows[0].n as number;
const uniq = () => Math.random().toString(36).slice(2, 8);
const codes = (body: { warnings: { code: string }[] }) => body.warnings.map((w) => w.code);

describe("import preview of a config with an odd head shape", () => {
  it("previews 30 heads over hidden_size 4096 with warnings the client schema accepts", async () => {
    const a = await agentAs(["researcher"]);
    const r = await a
      .post("/api/models/import")
      .set("X-CSRF-Token", a.csrf)
      .attach("file", fixture("thirty-heads.json"), "config.json")
      .expect(200);
    // The client reads every response through the shared schema; before the fix this failed (headDim 136.53…).
    const parsed = importResponseSchema.safeParse(r.body);
    expect(parsed.success).toBe(true);
    expect(codes(r.body)).toEqual(expect.arrayContaining(["head_dim_not_integer", "kv_heads_not_divisor"]));
    const head = r.body.warnings.find((w: { code: string }) => w.code === "head_dim_not_integer");
    expect(head.message).toContain("136.5");
    expect(head.fix).toMatch(/head_dim/);
    const kv = r.body.warnings.find((w: { code: string }) => w.code === "kv_heads_not_divisor");
    expect(kv.message).toMatch(/7/);
    // Divisors of 30 (arithmetic): 1, 2, 3, 5, 6, 10, 15, 30.
    expect(kv.fix).toContain("1, 2, 3, 5, 6, 10, 15 or 30");
    // No guessed head dimension: the box stays empty for the author to fill in.
    expect(r.body.profile.headDim).toBeUndefined();
    expect(r.body.profile).toMatchObject({ attentionHeads: 30, kvHeads: 7, hiddenSize: 4096 });
  });

  it("cannot be saved until head_dim is given; then saves with the warnings kept", async () => {
    const a = await agentAs(["researcher"]);
    const before = await count();
    const name = `Odd-${uniq()}`;
    const noHead = await a
      .post("/api/models/import?save=true")
      .set("X-CSRF-Token", a.csrf)
      .field("overrides", JSON.stringify({ name, kvHeads: 6 }))
      .attach("file", fixture("thirty-heads.json"), "config.json");
    expect(noHead.status).toBe(400);
    expect(noHead.body.error.fields).toHaveProperty("headDim");
    expect(await count()).toBe(before);
    const kvStill = await a
      .post("/api/models/import?save=true")
      .set("X-CSRF-Token", a.csrf)
      .field("overrides", JSON.stringify({ name, headDim: 128 }))
      .attach("file", fixture("thirty-heads.json"), "config.json");
    expect(kvStill.status).toBe(400);
    expect(kvStill.body.error.fields).toHaveProperty("kvHeads");
    expect(await count()).toBe(before);
    const ok = await a
      .post("/api/models/import?save=true")
      .set("X-CSRF-Token", a.csrf)
      .field("overrides", JSON.stringify({ name, headDim: 128, kvHeads: 6 }))
      .attach("file", fixture("thirty-heads.json"), "config.json")
      .expect(201);
    expect(ok.body.saved).toMatchObject({ name, headDim: 128, kvHeads: 6, attentionHeads: 30, rotaryDim: 128 });
    expect(ok.body.saved.importWarnings.map((w: { code: string }) => w.code)).toContain("head_dim_not_integer");
    expect(await count()).toBe(before + 1);
  });

  it("a head_dim in the file that is not a positive integer is a warning too, never a 500", async () => {
    const a = await agentAs(["researcher"]);
    const cfg = {
      ...JSON.parse(fixture("thirty-heads.json").toString("utf8")),
      head_dim: 136.5,
      num_key_value_heads: 10,
    };
    const r = await a
      .post("/api/models/import")
      .set("X-CSRF-Token", a.csrf)
      .attach("file", Buffer.from(JSON.stringify(cfg)), "config.json")
      .expect(200);
    expect(importResponseSchema.safeParse(r.body).success).toBe(true);
    expect(codes(r.body)).toContain("head_dim_not_integer");
    expect(codes(r.body)).not.toContain("kv_heads_not_divisor");
    expect(r.body.profile.headDim).toBeUndefined();
  });

  it("more key/value heads than query heads is a warning with a fix", async () => {
    const a = await agentAs(["researcher"]);
    const cfg = {
      ...JSON.parse(fixture("thirty-heads.json").toString("utf8")),
      num_attention_heads: 32,
      num_key_value_heads: 64,
    };
    const r = await a
      .post("/api/models/import")
      .set("X-CSRF-Token", a.csrf)
      .attach("file", Buffer.from(JSON.stringify(cfg)), "config.json")
      .expect(200);
    expect(codes(r.body)).toContain("kv_heads_not_divisor");
    expect(codes(r.body)).not.toContain("head_dim_not_integer");
    expect(r.body.profile.headDim).toBe(128);
  });
});
