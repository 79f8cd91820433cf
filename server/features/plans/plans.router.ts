import { z } from "zod";
import { route, type ApiFeature } from "../../http/route";
import {
  createPlanRequestSchema,
  dbIdParam,
  decisionRequestSchema,
  pageQuerySchema,
  planListQuerySchema,
  planSettingsSchema,
  updateRevisionRequestSchema,
} from "../../../shared/schemas";
import { targetIdSchema } from "../../../shared/schemas/exports";
import * as out from "../../../shared/schemas/plans";
import * as plans from "./plans.service";
import * as reads from "./reads.service";
import * as workflow from "./workflow.service";
import { exportRevision, revisionReport, verifyRevision } from "./export.service";

const planParams = z.object({ id: dbIdParam });
const reviewQueueQuerySchema = pageQuerySchema(50);
const revParams = planParams.extend({ n: dbIdParam });
const diffParams = planParams.extend({ a: dbIdParam, b: dbIdParam });
/** `?download=1` adds Content-Disposition: attachment with a file name. */
const downloadQuery = z.object({ download: z.string().max(8).optional() });
/** `?target=<id>` compiles the block for one consumer; `?stage=<n>` (1-based) exports that stage's block. */
const exportQuery = downloadQuery.extend({
  target: targetIdSchema.optional(),
  stage: z.coerce.number().int("a whole stage number").positive("stages count from 1").max(1000).optional(),
});
const exportFileName = (id: number, n: number, q: z.infer<typeof exportQuery>) =>
  `ropewalk-plan-${id}-r${n}${q.stage ? `-stage${q.stage}` : ""}-${q.target ?? "config-patch"}.json`;
const researcher = ["researcher"] as const;
const approver = ["approver"] as const;
const via = (locals: Record<string, unknown>) => (locals.viaToken ? "token" : "session") as "token" | "session";

/** Mounted at /api/plans: plans, their revisions, the sign-off workflow and exports. */
export const plansFeature: ApiFeature = {
  prefix: "/plans",
  tag: "plans",
  routes: [
    route({
      method: "get",
      path: "/",
      summary: "Plans, paged, sorted and filtered",
      access: "signed-in",
      query: planListQuerySchema,
      responses: { 200: out.planListResponseSchema },
      handler: async ({ deps, query }) => ({ status: 200, body: await plans.listPlans(deps, query) }),
    }),
    route({
      method: "post",
      path: "/",
      summary: "Create a plan with revision 1 as a draft",
      access: researcher,
      body: createPlanRequestSchema,
      responses: { 201: out.planDetailSchema },
      handler: async ({ deps, user, body }) => ({ status: 201, body: await plans.createPlanDetail(deps, user, body) }),
    }),
    route({
      method: "get",
      path: "/settings",
      summary: "Lab-wide plan settings",
      access: "signed-in",
      responses: { 200: planSettingsSchema },
      handler: async ({ deps }) => ({ status: 200, body: await reads.planSettings(deps) }),
    }),
    route({
      method: "put",
      path: "/settings",
      summary: "Set the lab-wide minimum of approvals (admin)",
      access: ["admin"],
      body: planSettingsSchema,
      responses: { 200: planSettingsSchema },
      handler: async ({ deps, user, body }) => ({
        status: 200,
        body: await plans.updatePlanSettings(deps, user, body.minRequiredApprovals),
      }),
    }),
    route({
      method: "get",
      path: "/owners",
      summary: "People who own plans (for filters)",
      access: "signed-in",
      responses: { 200: out.planOwnersResponseSchema },
      handler: async ({ deps }) => ({ status: 200, body: await reads.listPlanOwners(deps) }),
    }),
    route({
      method: "get",
      path: "/review-queue",
      summary: "Revisions awaiting my decision, paged (approver)",
      access: approver,
      query: reviewQueueQuerySchema,
      responses: { 200: out.reviewQueueResponseSchema },
      handler: async ({ deps, user, query }) => ({
        status: 200,
        body: await reads.listReviewQueue(deps, user.id, query),
      }),
    }),
    route({
      method: "get",
      path: "/:id",
      summary: "A plan with its revisions and decisions",
      access: "signed-in",
      params: planParams,
      responses: { 200: out.planDetailSchema },
      handler: async ({ deps, params }) => ({ status: 200, body: await plans.getPlan(deps, params.id) }),
    }),
    route({
      method: "get",
      path: "/:id/approved/export",
      summary: "Configuration patch of the latest approved revision (bearer token accepted)",
      access: "signed-in",
      params: planParams,
      query: exportQuery,
      responses: { 200: out.exportEnvelopeSchema },
      handler: async ({ deps, res, user, params, query }) => {
        const body = await exportRevision(deps, user, params.id, "approved", via(res.locals), query);
        if (query.download) res.attachment(exportFileName(params.id, body.revision, query));
        return { status: 200, body };
      },
    }),
    route({
      method: "post",
      path: "/:id/revisions",
      summary: "New draft from the latest revision",
      access: researcher,
      params: planParams,
      responses: { 201: out.newRevisionResponseSchema },
      handler: async ({ deps, user, params }) => ({
        status: 201,
        body: await plans.newRevision(deps, user, params.id),
      }),
    }),
    route({
      method: "get",
      path: "/:id/revisions/:n",
      summary: "One revision with its content",
      access: "signed-in",
      params: revParams,
      responses: { 200: out.revisionResponseSchema },
      handler: async ({ deps, params }) => ({ status: 200, body: await plans.getRevision(deps, params.id, params.n) }),
    }),
    route({
      method: "put",
      path: "/:id/revisions/:n",
      summary: "Edit a draft (optimistic version)",
      access: researcher,
      params: revParams,
      body: updateRevisionRequestSchema,
      responses: { 200: out.draftSavedSchema },
      handler: async ({ deps, user, params, body }) => ({
        status: 200,
        body: await plans.updateDraft(deps, user, params.id, params.n, body),
      }),
    }),
    route({
      method: "post",
      path: "/:id/revisions/:n/submit",
      summary: "Submit a draft for review",
      access: researcher,
      params: revParams,
      responses: { 200: out.transitionResponseSchema },
      handler: async ({ deps, user, params }) => ({
        status: 200,
        body: await workflow.submit(deps, user, params.id, params.n),
      }),
    }),
    route({
      method: "post",
      path: "/:id/revisions/:n/withdraw",
      summary: "Withdraw a revision from review",
      access: researcher,
      params: revParams,
      responses: { 200: out.transitionResponseSchema },
      handler: async ({ deps, user, params }) => ({
        status: 200,
        body: await workflow.withdraw(deps, user, params.id, params.n),
      }),
    }),
    route({
      method: "post",
      path: "/:id/revisions/:n/decisions",
      summary: "Approve or request changes (approver)",
      access: approver,
      params: revParams,
      body: decisionRequestSchema,
      responses: { 200: out.transitionResponseSchema },
      handler: async ({ deps, user, params, body }) => ({
        status: 200,
        body: await workflow.decide(deps, user, params.id, params.n, body),
      }),
    }),
    route({
      method: "get",
      path: "/:id/revisions/:n/verify",
      summary: "Recompute the content hash",
      access: "signed-in",
      params: revParams,
      responses: { 200: out.verifyResponseSchema },
      handler: async ({ deps, params }) => ({ status: 200, body: await verifyRevision(deps, params.id, params.n) }),
    }),
    route({
      method: "get",
      path: "/:id/revisions/:n/export",
      summary: "Configuration patch of a signed revision",
      access: "signed-in",
      params: revParams,
      query: exportQuery,
      responses: { 200: out.exportEnvelopeSchema },
      handler: async ({ deps, res, user, params, query }) => {
        const body = await exportRevision(deps, user, params.id, params.n, via(res.locals), query);
        if (query.download) res.attachment(exportFileName(params.id, params.n, query));
        return { status: 200, body };
      },
    }),
    route({
      method: "get",
      path: "/:id/revisions/:a/diff/:b",
      summary: "Differences between two revisions",
      access: "signed-in",
      params: diffParams,
      responses: { 200: out.diffResponseSchema },
      handler: async ({ deps, params }) => ({
        status: 200,
        body: await reads.diffRevisions(deps, params.id, params.a, params.b),
      }),
    }),
    route({
      method: "get",
      path: "/:id/revisions/:n/report",
      summary: "Printable HTML report",
      access: "signed-in",
      params: revParams,
      query: downloadQuery,
      responses: { 200: { contentType: "text/html", description: "The report page (attachment with ?download=1)" } },
      handler: async ({ deps, res, params, query }) => {
        const html = await revisionReport(deps, params.id, params.n);
        if (query.download) res.attachment(`ropewalk-plan-${params.id}-r${params.n}-report.html`);
        return { status: 200, raw: html };
      },
    }),
  ],
};
