import { Router } from "express";
import type { AppDeps } from "../../deps";
import { requireRole } from "../../http/auth";
import { parseQuery } from "../../http/validate";
import { listAuditEvents } from "./audit.service";
import { auditQuerySchema } from "../../../shared/schemas";
import { verifyAuditChain } from "../../platform/audit-chain";

/** Browse the append-only trail (admins and approvers), newest first, filtered. */
export function auditRouter(deps: AppDeps) {
  const r = Router();
  r.get("/", requireRole("admin", "approver"), async (req, res) => {
    res.json(await listAuditEvents(deps, parseQuery(auditQuerySchema, req)));
  });
  // Admins only: the answer says whether anyone with database rights rewrote the trail, and where.
  // One snapshot for the whole walk, so rows appended meanwhile neither count nor confuse it.
  r.get("/verify", requireRole("admin"), async (_req, res) => {
    res.json(await deps.db.transaction((tx) => verifyAuditChain(tx), { isolationLevel: "repeatable read", accessMode: "read only" }));
  });
  return r;
}
