import { z } from "zod";
import { lengthSchema, methodParamsSchema, modelInputSchema } from "./analysis";
import { layerGroupSchema, mropeSectionSchema } from "./models";
import { groupMethodSchema } from "./plans/requests";
import { EXTENDS_FROM } from "../lineage";

/*
 * Export targets (issue 10; routes GET /api/export-targets, POST /api/exports, GET /api/plans/:id/approved/export?target=).
 * The field names are fixed by the issue: tests outside the project read them.
 */

/** The target ids; server/engine/targets/index.ts checks at compile time that they equal the engine's TargetId. */
export const EXPORT_TARGET_IDS = [
  "transformers-v4-early",
  "transformers-v4",
  "transformers-v5",
  "vllm",
  "sglang",
  "llama-cpp",
] as const;
export const targetIdSchema = z.enum(EXPORT_TARGET_IDS, {
  error: `one of ${EXPORT_TARGET_IDS.join(", ")}`,
});

export const exportTargetsResponseSchema = z.object({
  targets: z.array(
    z.object({
      id: targetIdSchema,
      label: z.string(),
      consumer: z.string(),
      versions: z.array(z.string()),
      artifactKind: z.enum(["config-merge-patch", "launch-args"]),
    }),
  ),
});

export const exportRequestSchema = z.object({
  model: modelInputSchema,
  targetContext: lengthSchema,
  method: methodParamsSchema,
  /**
   * Lineage (shared/lineage.ts): with a saved profile that ships scaling, "served" reads the method's factor as a
   * stretch of the served length, exported over the pre-trained length. Absent: the pre-trained length.
   */
  extendsFrom: z.enum(EXTENDS_FROM).optional(),
  targets: z
    .array(targetIdSchema)
    .min(1, "name at least one target, or leave targets out for all")
    .max(EXPORT_TARGET_IDS.length)
    .optional(),
  /**
   * A layered model given inline (issue 11, additive): its layer groups, so the fingerprint and every target's
   * conformance cover each group. With { modelId } the profile's own groups are used and this is ignored.
   */
  layerGroups: z.array(layerGroupSchema).min(1).max(64).optional(),
  /** each non-scaled group's own method, as a plan's `groupMethods`; groups not listed stay as trained */
  groupMethods: z.array(groupMethodSchema).max(64).optional(),
  /**
   * A model with multimodal sections given inline (issue 11, additive): the config patches keep the sections in the
   * block, as they do over a saved profile's imported file. With { modelId } the file's own keys are used.
   */
  mropeSection: mropeSectionSchema.optional(),
  mropeInterleaved: z.boolean().optional(),
});
export type ExportRequest = z.infer<typeof exportRequestSchema>;

export const conformanceSchema = z.object({
  status: z.enum(["exact", "equivalent", "differs", "unsupported"]),
  maxRelativeError: z.number().nullable(),
  worstPair: z.number().nullable(),
  cause: z.string(),
  workaround: z.string(),
  /** a layered plan (issue 11): the comparison for each rotating layer group, in first-layer order */
  groups: z
    .array(
      z.object({
        kind: z.string(),
        status: z.enum(["exact", "equivalent", "differs", "unsupported"]),
        maxRelativeError: z.number().nullable(),
        worstPair: z.number().nullable(),
        cause: z.string(),
      }),
    )
    .optional(),
});

export const targetExportSchema = z.object({
  id: targetIdSchema,
  label: z.string(),
  /** null only when the target cannot produce any artifact for the plan (conformance says why) */
  artifact: z
    .object({
      kind: z.enum(["config-merge-patch", "launch-args"]),
      content: z.record(z.string(), z.unknown()),
      text: z.string(),
    })
    .nullable(),
  readBack: z.object({ invFreq: z.array(z.number()), attentionFactor: z.number() }).nullable(),
  conformance: conformanceSchema,
});
export type TargetExportBody = z.infer<typeof targetExportSchema>;

export const exportResponseSchema = z.object({
  invFreq: z.array(z.number()),
  attentionFactor: z.number(),
  rotaryDim: z.number(),
  /** SHA-256 of the rotary fingerprint layout (docs/fingerprint.md) */
  fingerprint: z.string(),
  targets: z.array(targetExportSchema),
});
export type ExportResponse = z.infer<typeof exportResponseSchema>;
