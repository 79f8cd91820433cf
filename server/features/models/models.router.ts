import { Router } from "express";
import multer from "multer";
import { z } from "zod";
import type { AppDeps } from "../../deps";
import { currentUser, requireAuth, requireRole } from "../../http/auth";
import { Invalid } from "../../platform/errors";
import { parseBody, parseParams } from "../../http/validate";
import { parseOr400 } from "../../platform/validate";
import { assertNotHostile } from "../../platform/hostile";
import { idParamSchema, modelProfileInputSchema } from "../../../shared/schemas";
import * as service from "./models.service";

export const MAX_CONFIG_BYTES = 1024 * 1024;

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MAX_CONFIG_BYTES, files: 1, fields: 4 },
  fileFilter: (_req, file, cb) => {
    const ok = /\.json$/i.test(file.originalname) || /json/.test(file.mimetype);
    if (ok) cb(null, true);
    else cb(new Invalid("only JSON files (config.json) can be imported", { file: "not a .json file" }));
  },
});

const importFlags = z.object({
  save: z.enum(["true", "false"]).optional(),
  overrides: z.string().max(64_000).optional(),
});

/** `usage` lists the plans that use a profile (the plans feature answers it; see ModelUsage). */
export function modelsRouter(deps: AppDeps, usage: service.ModelUsage) {
  const r = Router();
  const editors = requireRole("researcher", "infra", "admin");
  r.use(requireAuth);

  r.get("/", async (_req, res) => {
    res.json({ models: await service.listModels(deps) });
  });

  r.post("/import", editors, upload.single("file"), async (req, res) => {
    const flags = parseOr400(importFlags, { ...req.body, ...req.query }, "form");
    let overrides: unknown = {};
    if (flags.overrides) {
      try {
        overrides = JSON.parse(flags.overrides);
      } catch {
        throw new Invalid("overrides must be JSON", { overrides: "not valid JSON" });
      }
      assertNotHostile(overrides, "form", ["overrides"]);
      if (typeof overrides !== "object" || overrides === null || Array.isArray(overrides)) {
        throw new Invalid("overrides must be a JSON object of profile fields", { overrides: "not a JSON object" });
      }
    }
    const result = await service.importConfig(deps, currentUser(res), req.file, flags.save === "true", overrides as Record<string, unknown>);
    res.status(result.saved ? 201 : 200).json(result);
  });

  r.get("/:id", async (req, res) => {
    res.json({ model: await service.getModel(deps, parseParams(idParamSchema, req).id) });
  });

  r.get("/:id/source", async (req, res) => {
    const src = await service.getModelSource(deps, parseParams(idParamSchema, req).id);
    res.type("application/json").attachment(src.fileName).send(src.text);
  });

  r.post("/", editors, async (req, res) => {
    const input = parseBody(modelProfileInputSchema, req);
    res.status(201).json({ model: await service.createModel(deps, currentUser(res), input) });
  });

  r.put("/:id", editors, async (req, res) => {
    const { id } = parseParams(idParamSchema, req);
    const input = parseBody(modelProfileInputSchema, req);
    res.json({ model: await service.updateModel(deps, currentUser(res), id, input) });
  });

  // 204 when deleted; 200 with the retired profile and the plans that use it when it was retired instead.
  r.delete("/:id", editors, async (req, res) => {
    const out = await service.deleteModel(deps, usage, currentUser(res), parseParams(idParamSchema, req).id);
    if (out.deleted) res.status(204).end();
    else res.json({ retired: true, model: out.model, usedBy: out.usedBy });
  });

  r.post("/:id/retire", editors, async (req, res) => {
    res.json({ model: await service.retireModel(deps, usage, currentUser(res), parseParams(idParamSchema, req).id) });
  });

  r.post("/:id/restore", editors, async (req, res) => {
    res.json({ model: await service.restoreModel(deps, currentUser(res), parseParams(idParamSchema, req).id) });
  });

  return r;
}
