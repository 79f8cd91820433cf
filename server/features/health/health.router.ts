import { Router } from "express";
import type { AppDeps } from "../../deps";

export function healthRouter(deps: AppDeps) {
  const r = Router();
  r.get("/", async (_req, res) => {
    try {
      await deps.pool.query("SELECT 1");
      res.json({ ok: true, db: "up" });
    } catch {
      res.status(503).json({ ok: false, db: "down" });
    }
  });
  return r;
}
