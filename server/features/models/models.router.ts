import { singleFileUpload } from "../../http/file-upload";
import { Invalid } from "../../platform/errors";
import { route, type ApiFeature } from "../../http/route";
import { idParamSchema, importResponseSchema, modelProfileInputSchema } from "../../../shared/schemas";
import {
  modelResponseSchema,
  modelRetiredResponseSchema,
  modelsListQuerySchema,
  modelsListResponseSchema,
} from "../../../shared/schemas/models";
import { importFormSchema, readImportForm } from "./import-form";
import * as service from "./models.service";

export const MAX_CONFIG_BYTES = 1024 * 1024;

// 413 above the limit: the config import's contract since the first API issue ("JSON only, ≤1 MB, 413 above").
const upload = singleFileUpload("file", MAX_CONFIG_BYTES, {
  oversizeStatus: 413,
  fileFilter: (_req, file, cb) => {
    const ok = /\.json$/i.test(file.originalname) || /json/.test(file.mimetype);
    if (ok) cb(null, true);
    else cb(new Invalid("only JSON files (config.json) can be imported", { file: "not a .json file" }));
  },
});

const editors = ["researcher", "infra", "admin"] as const;

/**
 * Mounted at /api/models: stored model profiles and config.json import. `usage` lists the plans that use a profile
 * (the plans feature answers it; see ModelUsage).
 */
export const modelsFeature = (usage: service.ModelUsage): ApiFeature => ({
  prefix: "/models",
  tag: "models",
  routes: [
    route({
      method: "get",
      path: "/",
      summary: "List model profiles, one page by name (?page, ?pageSize, ?q name search, ?retired=exclude)",
      access: "signed-in",
      query: modelsListQuerySchema,
      responses: { 200: modelsListResponseSchema },
      handler: async ({ deps, query }) => ({ status: 200, body: await service.listModels(deps, query) }),
    }),
    route({
      method: "post",
      path: "/import",
      summary: "Parse (and optionally save) a config.json upload (multipart field 'file')",
      access: editors,
      form: { contentType: "multipart/form-data", schema: importFormSchema },
      middleware: () => upload,
      responses: {
        200: importResponseSchema.describe("Preview, nothing saved"),
        201: importResponseSchema.describe("Saved as a new profile"),
      },
      handler: async ({ deps, req, user }) => {
        const form = readImportForm({ ...req.body, ...req.query });
        const result = await service.importConfig(deps, user, req.file, form.save, form.overrides);
        return result.saved ? { status: 201, body: result } : { status: 200, body: result };
      },
    }),
    route({
      method: "get",
      path: "/:id",
      summary: "One model profile",
      access: "signed-in",
      params: idParamSchema,
      responses: { 200: modelResponseSchema },
      handler: async ({ deps, params }) => ({ status: 200, body: { model: await service.getModel(deps, params.id) } }),
    }),
    route({
      method: "get",
      path: "/:id/source",
      summary: "The uploaded config.json",
      access: "signed-in",
      params: idParamSchema,
      responses: { 200: { contentType: "application/json", description: "The file as uploaded (attachment)" } },
      handler: async ({ deps, res, params }) => {
        const src = await service.getModelSource(deps, params.id);
        res.attachment(src.fileName);
        return { status: 200, raw: src.text };
      },
    }),
    route({
      method: "post",
      path: "/",
      summary: "Create a model profile",
      access: editors,
      body: modelProfileInputSchema,
      responses: { 201: modelResponseSchema },
      handler: async ({ deps, user, body }) => ({
        status: 201,
        body: { model: await service.createModel(deps, user, body) },
      }),
    }),
    route({
      method: "put",
      path: "/:id",
      summary: "Replace a model profile",
      access: editors,
      params: idParamSchema,
      body: modelProfileInputSchema,
      responses: { 200: modelResponseSchema },
      handler: async ({ deps, user, params, body }) => ({
        status: 200,
        body: { model: await service.updateModel(deps, user, params.id, body) },
      }),
    }),
    route({
      method: "delete",
      path: "/:id",
      summary: "Delete a profile no plan uses (204); one that plans use is retired instead (200)",
      access: editors,
      params: idParamSchema,
      responses: {
        204: { contentType: null, description: "Deleted" },
        200: modelRetiredResponseSchema.describe("Retired instead, with the plans that use it"),
      },
      handler: async ({ deps, user, params }) => {
        const out = await service.deleteModel(deps, usage, user, params.id);
        if (out.deleted) return { status: 204, raw: null };
        return { status: 200, body: { retired: true as const, model: out.model, usedBy: out.usedBy } };
      },
    }),
    route({
      method: "post",
      path: "/:id/retire",
      summary: "Hide a profile from pickers; plans on it keep working",
      access: editors,
      params: idParamSchema,
      responses: { 200: modelResponseSchema },
      handler: async ({ deps, user, params }) => ({
        status: 200,
        body: { model: await service.retireModel(deps, usage, user, params.id) },
      }),
    }),
    route({
      method: "post",
      path: "/:id/restore",
      summary: "Offer a retired profile again",
      access: editors,
      params: idParamSchema,
      responses: { 200: modelResponseSchema },
      handler: async ({ deps, user, params }) => ({
        status: 200,
        body: { model: await service.restoreModel(deps, user, params.id) },
      }),
    }),
  ],
});
