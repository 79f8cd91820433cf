import { Router } from "express";
import type { AppDeps } from "../../deps";
import { currentUser, requireAuth } from "../../http/auth";
import { parseBody } from "../../http/validate";
import { analysisRequestSchema } from "../../../shared/schemas/analysis";
import { getModelShape } from "../models";
import { analyseRequest } from "./analyses.service";
import { AnalysisCancelled } from "./analyses.pool";

/** Mounted at /api/analyses. POST / is a stateless compute; nothing is stored. */
export function analysesRouter(deps: AppDeps) {
  const r = Router();
  r.post("/", requireAuth, async (req, res) => {
    const input = parseBody(analysisRequestSchema, req);
    const abort = new AbortController();
    // The connection closing before we answered means nobody waits: drop a large analysis still in the pool.
    res.on("close", () => {
      if (!res.writableEnded) abort.abort();
    });
    try {
      res.json(await analyseRequest(input, (id) => getModelShape(deps, id), { userId: currentUser(res).id, signal: abort.signal }));
    } catch (e) {
      if (e instanceof AnalysisCancelled) return;
      throw e;
    }
  });
  return r;
}
