/**
 * Hostile input never reaches a 500: every documented route (server/api-features.ts, as openapi.ts lists them) gets hostile values in each
 * path parameter, each documented query parameter and each body field (one at a time, the rest valid), and
 * must answer below 500; a 400 must name the field. Serial: the valid remainder of a body changes lab-wide rows.
 */
import crypto from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Response } from "supertest";
import { documentedRoutes } from "../../server/openapi";
import { ALL_FEATURES } from "../../server/api-features";
import { makeTestApp, type Agent } from "../setup/app";
import { createTestUser } from "../setup/users";
import { createPlan, createProfile, post } from "../setup/plans";
import { HOSTILE_IDS, mutations, namesField, NUL, type Path } from "../setup/fuzz";
import { fuzzBases, fuzzParams, VERSION_MARK, type FuzzIds } from "./fuzz-bases";

const { agent, agentAs } = makeTestApp();
let admin: Agent;
let anon: Agent;
let ids: FuzzIds;

const ROUTES = documentedRoutes(ALL_FEATURES);

const STATEFUL = new Set(["/api/plans/{id}/revisions/{n}", "/api/plans/{id}/revisions/{n}/decisions"]);

interface Finding {
  what: string;
  status: number;
  body: string;
}
const findings: Finding[] = [];
let sent = 0;

/** Records a 5xx, or a 400 that does not name the field; answers the response for further checks. */
function judge(what: string, r: Response, field: Path | null, plain = false) {
  sent++;
  const body = JSON.stringify(r.body ?? r.text).slice(0, 300);
  if (r.status >= 500) findings.push({ what, status: r.status, body });
  else if (
    r.status === 400 &&
    field &&
    !(plain ? Object.keys(r.body?.error?.fields ?? {}).length : namesField(r.body?.error?.fields, field))
  )
    findings.push({ what: `${what} (400 without the field)`, status: 400, body });
  return r;
}

function send(a: Agent, method: string, url: string, json?: string) {
  const req = (a as unknown as Record<string, (u: string) => ReturnType<Agent["get"]>>)
    [method](url)
    .set("X-CSRF-Token", a.csrf);
  return json === undefined ? req : req.set("Content-Type", "application/json").send(json);
}

/** The draft's current version, followed from each successful edit. */
let draftVersion = 1;
function fresh(json: string) {
  return json
    .replaceAll("@@U@@", crypto.randomBytes(4).toString("hex"))
    .replace(`"version":${VERSION_MARK}`, `"version":${draftVersion}`);
}

beforeAll(async () => {
  admin = await agentAs(["admin", "researcher", "infra", "approver"]);
  anon = await agent();
  const researcher = await agentAs(["researcher"]);
  const model = await createProfile(admin);
  const acc = await post(admin, "/api/accelerators", {
    name: `Skiff-${crypto.randomBytes(4).toString("hex")}`,
    memoryBytes: 80e9,
    peakFlops: 1e15,
    pricePerHour: 2,
  });
  const token = await post(admin, "/api/tokens", { name: "fuzz" });
  const draft = await createPlan(admin, model.id);
  const review = await createPlan(researcher, model.id);
  await post(researcher, `/api/plans/${review.id}/revisions/1/submit`).expect(200);
  const user = await createTestUser(["viewer"]);
  ids = {
    user: user.id,
    model: model.id,
    accelerator: acc.body.accelerator.id,
    token: token.body.id,
    draftPlan: draft.id,
    reviewPlan: review.id,
    reviewHash: review.revisions[0].contentHash,
  };
});

describe("hostile input on every documented route", () => {
  for (const route of ROUTES) {
    const key = `${route.method} ${route.path}`;
    it(key, async () => {
      const before = findings.length;
      const params = fuzzParams(route.path, ids);
      const url = route.path.replace(/\{(\w+)\}/g, (_m, k: string) => params[k]);
      const names = [...route.path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]);
      const routeBases = fuzzBases(ids)[key] ?? [];
      const firstBody = routeBases[0]
        ? fresh(JSON.stringify(routeBases[0]))
        : route.method === "get" || route.method === "delete"
          ? undefined
          : "{}";
      const who = route.path === "/api/auth/login" ? anon : admin;

      const jobs: (() => Promise<unknown>)[] = [];
      for (const name of names) {
        for (const bad of HOSTILE_IDS) {
          const badUrl = route.path.replace(/\{(\w+)\}/g, (_m, k: string) => (k === name ? bad : params[k]));
          jobs.push(async () =>
            judge(`${key} path ${name}=${bad}`, await send(who, route.method, badUrl, firstBody), [name]),
          );
        }
      }
      const queryKeys = Object.keys(route.query?.shape ?? {});
      for (const q of queryKeys) {
        for (const bad of [...HOSTILE_IDS, encodeURIComponent(NUL)]) {
          jobs.push(async () =>
            judge(`${key} query ${q}=${bad}`, await send(who, route.method, `${url}?${q}=${bad}`), [q]),
          );
        }
      }
      for (const m of routeBases.flatMap((base) => mutations(base))) {
        jobs.push(async () => {
          const r = await send(who, route.method, url, fresh(m.json));
          if (r.status === 200 && typeof r.body?.version === "number" && route.path === "/api/plans/{id}/revisions/{n}")
            draftVersion = r.body.version;
          judge(`${key} body ${m.path.join(".") || "(root)"} = ${m.label}`, r, m.path, m.plain);
        });
      }
      // Routes whose state moves on (draft versions, decisions) go one request at a time; the rest a few at once.
      const width = STATEFUL.has(route.path) ? 1 : 6;
      for (let i = 0; i < jobs.length; i += width) await Promise.all(jobs.slice(i, i + width).map((job) => job()));
      expect(findings.slice(before).map((f) => `${f.status} ${f.what}: ${f.body}`)).toEqual([]);
    });
  }

  it("post /api/models/import (multipart: the file and its overrides field)", async () => {
    const before = findings.length;
    const config = {
      _name_or_path: "fuzz/heron-@@U@@",
      model_type: "heron",
      hidden_size: 2048,
      num_attention_heads: 16,
      num_key_value_heads: 4,
      num_hidden_layers: 22,
      max_position_embeddings: 8192,
      rope_theta: 10000,
      torch_dtype: "bfloat16",
      rope_scaling: { rope_type: "yarn", factor: 2, original_max_position_embeddings: 4096 },
    };
    const overrides = {
      name: "Fuzz-@@U@@",
      currentScaling: { method: "yarn", params: { factor: 2 }, raw: { rope_type: "yarn" } },
    };
    const upload = (file: string, extra?: string) => {
      const req = admin.post("/api/models/import?save=true").set("X-CSRF-Token", admin.csrf);
      if (extra !== undefined) req.field("overrides", extra);
      return req.attach("file", Buffer.from(file, "utf8"), "config.json");
    };
    // NUL and runaway nesting must be blamed on the field that holds them; other values may fail a profile rule instead.
    const strict = (label: string) => label.includes("NUL") || label.includes("deep") || label === JSON.stringify(NUL);
    const jobs = [
      ...mutations(config).map(
        (m) => async () =>
          judge(
            `import file ${m.path.join(".") || "(root)"} = ${m.label}`,
            await upload(fresh(m.json)),
            ["file"],
            !strict(m.label),
          ),
      ),
      ...mutations(overrides).map((m) => async () => {
        const r = await upload(fresh(JSON.stringify(config)), fresh(m.json));
        const named =
          namesField(r.body?.error?.fields, ["overrides", ...m.path]) || namesField(r.body?.error?.fields, m.path);
        judge(
          `import overrides ${m.path.join(".") || "(root)"} = ${m.label}`,
          r,
          named ? null : ["overrides", ...m.path],
          !strict(m.label),
        );
      }),
    ];
    for (let i = 0; i < jobs.length; i += 4) await Promise.all(jobs.slice(i, i + 4).map((job) => job()));
    expect(findings.slice(before).map((f) => `${f.status} ${f.what}: ${f.body}`)).toEqual([]);
  });

  it("lists every profile afterwards (no stored profile breaks GET /api/models)", async () => {
    // every page, not just the first
    for (let page = 1; ; page++) {
      const r = await admin.get(`/api/models?pageSize=200&page=${page}`);
      expect(r.status, JSON.stringify(r.body).slice(0, 300)).toBe(200);
      if (r.body.models.length < 200) break;
    }
  });
});

afterAll(() => {
  const byStatus = findings.reduce<Record<number, number>>(
    (acc, f) => ({ ...acc, [f.status]: (acc[f.status] ?? 0) + 1 }),
    {},
  );
  console.info(`fuzz: ${sent} requests, ${findings.length} findings ${JSON.stringify(byStatus)}`);
});
