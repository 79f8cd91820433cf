import { route, type ApiFeature } from "../../http/route";
import { auditChainReportSchema, auditQuerySchema } from "../../../shared/schemas";
import { auditPageSchema } from "../../../shared/schemas/audit";
import { listAuditEvents, verifyTrail } from "./audit.service";

/** Browse the append-only trail (admins and approvers); mounted at /api/audit. */
export const auditFeature: ApiFeature = {
  prefix: "/audit",
  tag: "audit",
  routes: [
    route({
      method: "get",
      path: "/",
      summary: "Audit trail (admin, approver)",
      access: ["admin", "approver"],
      query: auditQuerySchema,
      responses: { 200: auditPageSchema },
      handler: async ({ deps, query }) => ({ status: 200, body: await listAuditEvents(deps, query) }),
    }),
    // Admins only: the answer says whether anyone with database rights rewrote the trail, and where.
    route({
      method: "get",
      path: "/verify",
      summary: "Check the audit hash chain; names the first broken link (admin)",
      access: ["admin"],
      responses: { 200: auditChainReportSchema },
      handler: async ({ deps }) => ({ status: 200, body: await verifyTrail(deps) }),
    }),
  ],
};
