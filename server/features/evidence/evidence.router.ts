import { z } from "zod";
import { route, type ApiFeature } from "../../http/route";
import { singleFileUpload } from "../../http/file-upload";
import { dbIdParam } from "../../../shared/schemas";
import {
  evidenceFormSchema,
  evidenceListResponseSchema,
  evidenceUploadResponseSchema,
  proofRequestSchema,
  proofResponseSchema,
} from "../../../shared/schemas/evidence-api";
import { MAX_EVIDENCE_BYTES } from "./parse";
import { evidenceDownload, listEvidence, uploadEvidence } from "./evidence.service";
import { decideProof } from "./proof.service";

const revParams = z.object({ id: dbIdParam, n: dbIdParam });
const fileParams = revParams.extend({ evidenceId: dbIdParam });

/** Mounted at /api/plans: evaluation evidence on an approved revision, the verdict per criterion, and proof. */
export const evidenceFeature: ApiFeature = {
  prefix: "/plans",
  tag: "plans",
  routes: [
    route({
      method: "post",
      path: "/:id/revisions/:n/evidence",
      summary: "Upload evaluation results for an approved revision (bearer token with evidence:write accepted)",
      access: ["researcher"],
      params: revParams,
      form: { contentType: "multipart/form-data", schema: evidenceFormSchema },
      middleware: () => singleFileUpload("file", MAX_EVIDENCE_BYTES, { fields: 8, fieldSize: 256 * 1024 }),
      responses: { 201: evidenceUploadResponseSchema },
      handler: async ({ deps, req, res, user, params }) => ({
        status: 201,
        body: await uploadEvidence(
          deps,
          user,
          params.id,
          params.n,
          { file: req.file, fields: { ...(req.body as Record<string, unknown>) } },
          res.locals.viaToken ? "token" : "session",
        ),
      }),
    }),
    route({
      method: "get",
      path: "/:id/revisions/:n/evidence",
      summary: "A revision's evidence and each acceptance criterion's verdict (pass, fail, no_data, insufficient)",
      access: "signed-in",
      params: revParams,
      responses: { 200: evidenceListResponseSchema },
      handler: async ({ deps, params }) => ({ status: 200, body: await listEvidence(deps, params.id, params.n) }),
    }),
    route({
      method: "get",
      path: "/:id/revisions/:n/evidence/:evidenceId/file",
      summary: "The evidence file as uploaded (attachment)",
      access: "signed-in",
      params: fileParams,
      responses: { 200: { contentType: "text/plain", description: "The file as uploaded" } },
      handler: async ({ deps, res, params }) => {
        const f = await evidenceDownload(deps, params.id, params.n, params.evidenceId);
        res.attachment(f.fileName);
        return { status: 200, raw: f.text };
      },
    }),
    route({
      method: "post",
      path: "/:id/revisions/:n/proof",
      summary: "An approver marks an approved revision proven (every criterion passes) or unproven (with a reason)",
      access: ["approver"],
      params: revParams,
      body: proofRequestSchema,
      responses: { 200: proofResponseSchema },
      handler: async ({ deps, user, params, body }) => ({
        status: 200,
        body: await decideProof(deps, user, params.id, params.n, body),
      }),
    }),
  ],
};
