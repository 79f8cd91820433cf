import { describe, expect, it } from "vitest";
import { makeTestApp, type Agent } from "../setup/app";
import { testDb } from "../setup/db";
import { sampleProfile } from "../fixtures/profiles";
import { modelsListResponseSchema } from "../../shared/schemas/models";
import { usersListResponseSchema } from "../../shared/schemas/users";

// Profiles and users answer one page at a time, with a capped total and a name search (issue 14: a busy lab's
// 2 000 profiles made GET /api/models 1.1 MB). Each test makes rows under a prefix of its own and searches for it,
// so other files' rows in the shared test database do not matter.
const { agentAs } = makeTestApp();
const uniq = () => Math.random().toString(36).slice(2, 8);

async function makeProfiles(a: Agent, prefix: string, n: number) {
  const made: { id: number; name: string }[] = [];
  for (let i = 0; i < n; i++) {
    const r = await a
      .post("/api/models")
      .set("X-CSRF-Token", a.csrf)
      .send(sampleProfile({ name: `${prefix}-${String(i).padStart(2, "0")}` }))
      .expect(201);
    made.push(r.body.model);
  }
  return made;
}

describe("GET /api/models pages", () => {
  it("answers one page by name with a total; ?q finds by part of the name; pages do not overlap", async () => {
    const a = await agentAs(["researcher"]);
    const prefix = `Pagefinder-${uniq()}`;
    const made = await makeProfiles(a, prefix, 7);
    const page = async (n: number) =>
      modelsListResponseSchema.parse(
        (await a.get(`/api/models?q=${prefix.toLowerCase()}&pageSize=3&page=${n}`).expect(200)).body,
      );
    const [one, two, three] = [await page(1), await page(2), await page(3)];
    expect(one).toMatchObject({ total: 7, totalCapped: false, page: 1, pageSize: 3 });
    expect([...one.models, ...two.models, ...three.models].map((m) => m.name)).toEqual(made.map((m) => m.name));
    expect(three.models).toHaveLength(1);
  });

  it("defaults to 50 per page and never sends the uploaded file", async () => {
    const a = await agentAs(["researcher"]);
    const r = await a.get("/api/models").expect(200);
    expect(r.body.pageSize).toBe(50);
    expect(r.body.models.length).toBeLessThanOrEqual(50);
    for (const m of r.body.models) expect(m).not.toHaveProperty("sourceConfig");
  });

  it("retired=exclude leaves retired profiles out (pickers); the default lists them", async () => {
    const a = await agentAs(["researcher"]);
    const prefix = `Retirefinder-${uniq()}`;
    const [kept, retired] = await makeProfiles(a, prefix, 2);
    await testDb().pool.query("UPDATE model_profiles SET retired_at = now() WHERE id = $1", [retired.id]);
    const names = async (extra: string) =>
      (await a.get(`/api/models?q=${prefix}${extra}`).expect(200)).body.models.map((m: { name: string }) => m.name);
    expect(await names("")).toEqual([kept.name, retired.name]);
    expect(await names("&retired=exclude")).toEqual([kept.name]);
  });

  it("a search for % or _ means those characters, not wildcards", async () => {
    const a = await agentAs(["researcher"]);
    const prefix = `Wild-${uniq()}`;
    await makeProfiles(a, prefix, 1);
    expect((await a.get(`/api/models?q=${prefix}%25`).expect(200)).body.total).toBe(0);
    expect((await a.get(`/api/models?q=${prefix}-_0`).expect(200)).body.total).toBe(0);
  });

  it.each([
    ["page=0", "page"],
    ["pageSize=201", "pageSize"],
    ["retired=maybe", "retired"],
    [`q=${"x".repeat(121)}`, "q"],
  ])("?%s → 400 naming %s", async (query, field) => {
    const a = await agentAs(["viewer"]);
    const r = await a.get(`/api/models?${query}`);
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toHaveProperty(field);
  });
});

describe("GET /api/users pages", () => {
  it("answers one page in id order with a total; ?q finds by name or e-mail", async () => {
    const admin = await agentAs(["admin"]);
    const tag = uniq();
    const made: number[] = [];
    for (let i = 0; i < 5; i++) {
      const r = await admin
        .post("/api/users")
        .set("X-CSRF-Token", admin.csrf)
        .send({
          email: `lister-${tag}-${i}@ropewalk.test`,
          name: `Lister ${i}`,
          password: "long-enough-pass",
          roles: ["viewer"],
        })
        .expect(201);
      made.push(r.body.user.id);
    }
    const byMail = usersListResponseSchema.parse(
      (await admin.get(`/api/users?q=lister-${tag}&pageSize=2&page=2`).expect(200)).body,
    );
    expect(byMail).toMatchObject({ total: 5, totalCapped: false, page: 2, pageSize: 2 });
    expect(byMail.users.map((u) => u.id)).toEqual(made.slice(2, 4));
    for (const u of byMail.users) expect(u).not.toHaveProperty("passwordHash");

    await admin
      .patch(`/api/users/${made[0]}`)
      .set("X-CSRF-Token", admin.csrf)
      .send({ name: `Hawser ${tag}` })
      .expect(200);
    const byName = (await admin.get(`/api/users?q=hawser ${tag}`).expect(200)).body;
    expect(byName.users.map((u: { id: number }) => u.id)).toEqual([made[0]]);
  });

  it("stays admin-only and refuses a bad page naming the field", async () => {
    expect((await (await agentAs(["researcher"])).get("/api/users?page=1")).status).toBe(403);
    const r = await (await agentAs(["admin"])).get("/api/users?pageSize=0");
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toHaveProperty("pageSize");
  });
});
