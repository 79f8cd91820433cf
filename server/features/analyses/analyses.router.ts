import { Router } from "express";
import type { AppDeps } from "../../deps";
import { requireAuth } from "../../http/auth";
import { parseBody } from "../../http/validate";
import { analysisRequestSchema } from "../../../shared/schemas/analysis";
import { getModelShape } from "../models/models.service";
import { analyseRequest } from "./analyses.service";

/** Mounted at /api/analyses. POST / is a stateless compute; nothing is stored. */
export function analysesRouter(deps: AppDeps) {
  const r = Router();
  r.post("/", requireAuth, async (req, res) => {
    const input = parseBody(analysisRequestSchema, req);
    res.json(await analyseRequest(input, (id) => getModelShape(deps, id)));
  });
  return r;
}
