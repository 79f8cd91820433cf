import { Router } from "express";
import { z } from "zod";
import type { AppDeps } from "../../deps";
import { requireRole } from "../../http/auth";
import { parseQuery } from "../../http/validate";
import { deliverNow, listMail } from "./mail.service";

const listQuery = z.object({ q: z.string().trim().max(200).optional() });

/** Admin-only view of the local sink and the outbox; mounted at /api/mail. */
export function mailRouter(deps: AppDeps) {
  const r = Router();
  r.use(requireRole("admin"));

  r.get("/", async (req, res) => {
    const { q } = parseQuery(listQuery, req);
    res.json(await listMail(deps, q || undefined));
  });

  r.post("/deliver", async (_req, res) => {
    res.json(await deliverNow(deps));
  });

  return r;
}
