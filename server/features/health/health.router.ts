import { Router } from "express";
import type { AppDeps } from "../../deps";

/** Health answers within this long even when the database hangs (the issue asks for 503 within 5 s). */
export const HEALTH_TIMEOUT_MS = 3000;

export function healthRouter(deps: AppDeps) {
  const r = Router();
  r.get("/", async (_req, res) => {
    let timer: NodeJS.Timeout | undefined;
    const late = new Promise<never>((_resolve, reject) => {
      timer = setTimeout(() => reject(new Error("health check timed out")), HEALTH_TIMEOUT_MS);
    });
    try {
      await Promise.race([deps.pool.query("SELECT 1"), late]);
      res.json({ ok: true, db: "up" });
    } catch {
      res.set("Retry-After", "5").status(503).json({ ok: false, db: "down" });
    } finally {
      clearTimeout(timer);
    }
  });
  return r;
}
