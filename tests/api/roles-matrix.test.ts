import { describe, expect, it } from "vitest";
import { ROLES, type Role } from "../../shared/schemas";
import { makeTestApp, type Agent } from "../setup/app";
import { createPlan, createProfile, decide, post, put } from "../setup/plans";

const { agentAs } = makeTestApp();

/**
 * Every route added after the foundation × every role → expected status. The acting user holds exactly one role;
 * for "researcher" the acting user is also the plan's author, so author-only actions succeed for that role only.
 */
interface World {
  me: Agent;
  planId: number;
  draft: string;
  inReview: string;
  approvedPlan: number;
}

async function world(role: Role): Promise<World> {
  const me = await agentAs([role]);
  const author = role === "researcher" ? me : await agentAs(["researcher"]);
  const other = await agentAs(["approver"]);
  const model = await createProfile(author);
  const draft = await createPlan(author, model.id);
  const review = await createPlan(author, model.id);
  await post(author, `/api/plans/${review.id}/revisions/1/submit`).expect(200);
  const approved = await createPlan(author, model.id);
  await post(author, `/api/plans/${approved.id}/revisions/1/submit`).expect(200);
  await decide(other, `/api/plans/${approved.id}/revisions/1/decisions`, { decision: "approve" }).expect(200);
  return {
    me,
    planId: draft.id,
    draft: `/api/plans/${draft.id}/revisions/1`,
    inReview: `/api/plans/${review.id}/revisions/1`,
    approvedPlan: approved.id,
  };
}

type Case = [name: string, call: (w: World) => Promise<{ status: number }>, allowed: Role[] | "all", ok: number];
const all = "all" as const;
const analysis = {
  model: { headDim: 128, ropeTheta: 10000, trainedContext: 4096 },
  targetContext: 16384,
  methods: [{ method: "linear" }],
};
const budget = {
  model: { parameters: 7e9, layers: 32, attentionHeads: 32, kvHeads: 8, headDim: 128 },
  cluster: { peakFlops: 1e15, memoryBytes: 80e9, pricePerHour: 2 },
  accelerators: 8,
  stages: [{ sequenceLength: 8192, steps: 10, globalBatch: 8 }],
};

const CASES: Case[] = [
  ["GET /api/models", (w) => w.me.get("/api/models"), all, 200],
  ["POST /api/analyses", (w) => post(w.me, "/api/analyses", analysis), all, 200],
  [
    "POST /api/bounds/base",
    (w) => post(w.me, "/api/bounds/base", { rotaryDim: 128, base: 10000, maxLength: 4096 }),
    all,
    200,
  ],
  ["GET /api/plans", (w) => w.me.get("/api/plans"), all, 200],
  [
    "POST /api/plans",
    async (w) =>
      post(w.me, "/api/plans", {
        title: "m",
        modelId: (await createProfile(await agentAs(["infra"]))).id,
        revision: { targetContext: 8192, method: { method: "linear" } },
      }),
    ["researcher"],
    201,
  ],
  ["GET /api/plans/:id", (w) => w.me.get(`/api/plans/${w.planId}`), all, 200],
  ["GET revision", (w) => w.me.get(w.draft), all, 200],
  ["PUT draft", (w) => put(w.me, w.draft, { version: 1, notes: "x" }), ["researcher"], 200],
  ["POST submit", (w) => post(w.me, `${w.draft}/submit`), ["researcher"], 200],
  ["POST withdraw", (w) => post(w.me, `${w.inReview}/withdraw`), ["researcher"], 200],
  ["POST decisions", (w) => decide(w.me, `${w.inReview}/decisions`, { decision: "approve" }), ["approver"], 200],
  ["POST new revision", (w) => post(w.me, `/api/plans/${w.approvedPlan}/revisions`), ["researcher"], 201],
  ["GET verify", (w) => w.me.get(`${w.draft}/verify`), all, 200],
  ["GET diff", (w) => w.me.get(`/api/plans/${w.planId}/revisions/1/diff/1`), all, 200],
  ["GET report", (w) => w.me.get(`${w.draft}/report`), all, 200],
  ["GET approved export", (w) => w.me.get(`/api/plans/${w.approvedPlan}/approved/export`), all, 200],
  ["GET review-queue", (w) => w.me.get("/api/plans/review-queue"), ["approver"], 200],
  ["GET settings", (w) => w.me.get("/api/plans/settings"), all, 200],
  ["GET /api/tokens", (w) => w.me.get("/api/tokens"), all, 200],
  ["POST /api/tokens", (w) => post(w.me, "/api/tokens", { name: "t" }), all, 201],
  ["GET /api/audit", (w) => w.me.get("/api/audit"), ["admin", "approver"], 200],
  ["GET /api/mail", (w) => w.me.get("/api/mail"), ["admin"], 200],
  ["POST /api/budgets/estimate", (w) => post(w.me, "/api/budgets/estimate", budget), all, 200],
  ["GET /api/budgets/recipes", (w) => w.me.get("/api/budgets/recipes"), all, 200],
  ["GET /api/budgets/currency", (w) => w.me.get("/api/budgets/currency"), all, 200],
  ["GET /api/accelerators", (w) => w.me.get("/api/accelerators"), all, 200],
  [
    "POST /api/accelerators",
    (w) =>
      post(w.me, "/api/accelerators", {
        name: `m-${Math.random()}`,
        memoryBytes: 8e10,
        peakFlops: 1e15,
        pricePerHour: 1,
      }),
    ["infra", "admin"],
    201,
  ],
];

describe("role matrix: models, engine, plans, tokens, audit, mail, budgets", () => {
  for (const role of ROLES) {
    it(`as ${role}`, async () => {
      const w = await world(role);
      const got: Record<string, number> = {};
      const want: Record<string, number> = {};
      for (const [name, call, allowed, ok] of CASES) {
        got[name] = (await call(w)).status;
        want[name] = allowed === "all" || allowed.includes(role) ? ok : 403;
      }
      expect(got).toEqual(want);
    });
  }
});
