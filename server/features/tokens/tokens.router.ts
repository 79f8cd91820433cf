import { Router } from "express";
import type { AppDeps } from "../../deps";
import { currentUser, requireAuth } from "../../http/auth";
import { parseBody, parseParams } from "../../http/validate";
import { createTokenRequestSchema, idParamSchema } from "../../../shared/schemas";
import { createToken, listTokens, revokeToken } from "./tokens.service";

export function tokensRouter(deps: AppDeps) {
  const r = Router();
  r.use(requireAuth);
  // A created token's secret appears in exactly one answer; nothing may cache it.
  r.use((_req, res, next) => {
    res.set("Cache-Control", "no-store");
    next();
  });
  r.get("/", async (_req, res) => {
    res.json({ tokens: await listTokens(deps, currentUser(res)) });
  });
  r.post("/", async (req, res) => {
    const { name, scopes } = parseBody(createTokenRequestSchema, req);
    res.status(201).json(await createToken(deps, currentUser(res), name, scopes));
  });
  r.delete("/:id", async (req, res) => {
    await revokeToken(deps, currentUser(res), parseParams(idParamSchema, req).id);
    res.status(204).end();
  });
  return r;
}
