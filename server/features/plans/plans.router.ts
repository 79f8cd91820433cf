import { Router } from "express";
import { z } from "zod";
import type { AppDeps } from "../../deps";
import { currentUser, requireAuth, requireRole } from "../../http/auth";
import { parseBody, parseParams, parseQuery } from "../../http/validate";
import {
  createPlanRequestSchema, dbIdParam, decisionRequestSchema, planListQuerySchema, planSettingsSchema, updateRevisionRequestSchema,
} from "../../../shared/schemas";
import * as plans from "./plans.service";
import * as workflow from "./workflow.service";
import { exportRevision, revisionReport, verifyRevision } from "./export.service";
import { diffContents } from "./diff";
import { planOwners, reviewQueue } from "./plans.list";

const planParams = z.object({ id: dbIdParam });
const revParams = planParams.extend({ n: dbIdParam });
const diffParams = planParams.extend({ a: dbIdParam, b: dbIdParam });

export function plansRouter(deps: AppDeps) {
  const r = Router();
  r.use(requireAuth);
  const via = (res: { locals: Record<string, unknown> }) => (res.locals.viaToken ? "token" : "session") as "token" | "session";

  r.get("/", async (req, res) => {
    res.json(await plans.listPlans(deps, parseQuery(planListQuerySchema, req)));
  });
  r.post("/", requireRole("researcher"), async (req, res) => {
    const input = parseBody(createPlanRequestSchema, req);
    const created = await plans.createPlan(deps, currentUser(res), input);
    res.status(201).json(await plans.getPlan(deps, created.id));
  });

  r.get("/settings", async (_req, res) => {
    res.json({ minRequiredApprovals: await plans.minRequiredApprovals(deps) });
  });
  r.put("/settings", requireRole("admin"), async (req, res) => {
    const { minRequiredApprovals: min } = parseBody(planSettingsSchema, req);
    res.json(await plans.updatePlanSettings(deps, currentUser(res), min));
  });

  r.get("/owners", async (_req, res) => {
    res.json({ owners: await planOwners(deps.db) });
  });

  r.get("/review-queue", requireRole("approver"), async (_req, res) => {
    const rows = await reviewQueue(deps.db, currentUser(res).id);
    res.json({
      items: rows.map((q) => ({
        planId: q.plan_id, title: q.title, revision: q.number, author: q.author_name, submittedAt: new Date(q.submitted_at).toISOString(),
        contentHash: q.content_hash, approvals: q.approvals, requiredApprovals: q.required_approvals,
      })),
    });
  });

  r.get("/:id", async (req, res) => {
    res.json(await plans.getPlan(deps, parseParams(planParams, req).id));
  });
  r.get("/:id/approved/export", async (req, res) => {
    const { id } = parseParams(planParams, req);
    const out = await exportRevision(deps, currentUser(res), id, "approved", via(res));
    if (req.query.download) res.attachment(`ropewalk-plan-${id}-r${out.revision}-config-patch.json`);
    res.json(out);
  });
  r.post("/:id/revisions", requireRole("researcher"), async (req, res) => {
    const out = await plans.newRevision(deps, currentUser(res), parseParams(planParams, req).id);
    res.status(201).json(out);
  });
  r.get("/:id/revisions/:n", async (req, res) => {
    const { id, n } = parseParams(revParams, req);
    res.json(await plans.getRevision(deps, id, n));
  });
  r.put("/:id/revisions/:n", requireRole("researcher"), async (req, res) => {
    const { id, n } = parseParams(revParams, req);
    res.json(await plans.updateDraft(deps, currentUser(res), id, n, parseBody(updateRevisionRequestSchema, req)));
  });
  r.post("/:id/revisions/:n/submit", requireRole("researcher"), async (req, res) => {
    const { id, n } = parseParams(revParams, req);
    res.json(await workflow.submit(deps, currentUser(res), id, n));
  });
  r.post("/:id/revisions/:n/withdraw", requireRole("researcher"), async (req, res) => {
    const { id, n } = parseParams(revParams, req);
    res.json(await workflow.withdraw(deps, currentUser(res), id, n));
  });
  r.post("/:id/revisions/:n/decisions", requireRole("approver"), async (req, res) => {
    const { id, n } = parseParams(revParams, req);
    res.json(await workflow.decide(deps, currentUser(res), id, n, parseBody(decisionRequestSchema, req)));
  });
  r.get("/:id/revisions/:n/verify", async (req, res) => {
    const { id, n } = parseParams(revParams, req);
    res.json(await verifyRevision(deps, id, n));
  });
  r.get("/:id/revisions/:n/export", async (req, res) => {
    const { id, n } = parseParams(revParams, req);
    const out = await exportRevision(deps, currentUser(res), id, n, via(res));
    if (req.query.download) res.attachment(`ropewalk-plan-${id}-r${n}-config-patch.json`);
    res.json(out);
  });
  r.get("/:id/revisions/:a/diff/:b", async (req, res) => {
    const { id, a, b } = parseParams(diffParams, req);
    const [ra, rb] = await Promise.all([plans.getRevision(deps, id, a), plans.getRevision(deps, id, b)]);
    res.json({ a: { number: a, contentHash: ra.contentHash }, b: { number: b, contentHash: rb.contentHash }, ...diffContents(ra.content, rb.content) });
  });
  r.get("/:id/revisions/:n/report", async (req, res) => {
    const { id, n } = parseParams(revParams, req);
    const html = await revisionReport(deps, id, n);
    if (req.query.download) res.attachment(`ropewalk-plan-${id}-r${n}-report.html`);
    res.type("html").send(html);
  });
  return r;
}
