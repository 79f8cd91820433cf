import { z } from "zod";
import { MAX_DB_ID } from "./common";

/** Lengths are stored in PostgreSQL integer columns, so at most 2^31 − 1. */
const MAX_LEN = MAX_DB_ID;
const finite = () => z.number().finite();
const posInt = (max = MAX_LEN) => z.number().int().positive().max(max);

/** A method and its parameters as a profile's "current scaling" (read from a config's rope_scaling block). */
export const currentScalingSchema = z.object({
  method: z.string(),
  params: z.record(z.string(), z.unknown()),
  raw: z.record(z.string(), z.unknown()),
});
export type CurrentScaling = z.infer<typeof currentScalingSchema>;

const profileFields = z.object({
  name: z.string().trim().min(1).max(120),
  family: z.string().trim().min(1).max(80),
  headDim: posInt(4096),
  partialRotaryFactor: finite().gt(0, "must be above 0").lte(1, "must be at most 1").default(1),
  ropeTheta: finite().gt(1, "must be above 1").max(1e15),
  trainedContext: posInt(),
  maxPositionEmbeddings: posInt().nullable().optional(),
  layers: posInt(10_000),
  attentionHeads: posInt(10_000),
  kvHeads: posInt(10_000),
  hiddenSize: posInt(1_000_000),
  parameters: finite().positive().max(1e15).describe("non-embedding parameter count"),
  parametersTotal: finite().positive().max(1e15).nullable().optional(),
  // At least one bit per element: a denormal here would make every memory figure derived from it meaningless.
  bytesPerElement: finite().positive().min(0.125, "at least 0.125 (one bit)").max(16).default(2),
  provenance: z.string().max(4000).default(""),
  currentScaling: currentScalingSchema.nullable().optional(),
});

/** Cross-field rules, each reported on the field a user would fix. */
function checkShape(v: z.infer<typeof profileFields>, ctx: z.RefinementCtx) {
  const d = v.headDim * v.partialRotaryFactor;
  if (Math.abs(d - Math.round(d)) > 1e-9 || Math.round(d) % 2 !== 0 || Math.round(d) <= 0) {
    ctx.addIssue({
      code: "custom",
      path: ["partialRotaryFactor"],
      message: `rotary dimension headDim × partialRotaryFactor = ${d} must be a positive even integer`,
    });
  }
  if (v.kvHeads > v.attentionHeads)
    ctx.addIssue({ code: "custom", path: ["kvHeads"], message: "cannot exceed attentionHeads" });
  else if (v.attentionHeads % v.kvHeads !== 0)
    ctx.addIssue({ code: "custom", path: ["kvHeads"], message: "attentionHeads must be a multiple of kvHeads" });
  if (v.parametersTotal != null && v.parametersTotal < v.parameters)
    ctx.addIssue({ code: "custom", path: ["parametersTotal"], message: "cannot be below the non-embedding count" });
}

export const modelProfileInputSchema = profileFields.superRefine(checkShape);
export type ModelProfileInput = z.input<typeof modelProfileInputSchema>;
export type ModelProfileValues = z.output<typeof modelProfileInputSchema>;

export const importWarningSchema = z.object({ code: z.string(), message: z.string(), fix: z.string() });
export type ImportWarning = z.infer<typeof importWarningSchema>;

export const modelProfileSchema = profileFields.extend({
  id: z.number().int(),
  rotaryDim: z.number().int(),
  pairs: z.number().int(),
  sourceFileName: z.string().nullable(),
  /** When a profile that plans use left the pickers (ISO time), or null while it is offered. */
  retiredAt: z.string().nullable(),
  importWarnings: z.array(importWarningSchema),
  createdBy: z.number().int().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type ModelProfile = z.infer<typeof modelProfileSchema>;

/**
 * What an import read from a file, before the author corrects it: any field may be missing (headDim when the file's
 * head shape is not a whole number) and numbers are only checked to be finite, so every preview renders; the
 * warnings say what to fix, and saving applies modelProfileInputSchema.
 */
export const importPreviewProfileSchema = profileFields
  .extend({
    headDim: finite(),
    partialRotaryFactor: finite(),
    ropeTheta: finite(),
    trainedContext: finite(),
    maxPositionEmbeddings: finite().nullable(),
    layers: finite(),
    attentionHeads: finite(),
    kvHeads: finite(),
    hiddenSize: finite(),
    parameters: finite(),
    parametersTotal: finite().nullable(),
    bytesPerElement: finite(),
    name: z.string(),
    family: z.string(),
    provenance: z.string(),
  })
  .partial();
export type ImportPreviewProfile = z.infer<typeof importPreviewProfileSchema>;

export const importResponseSchema = z.object({
  profile: importPreviewProfileSchema,
  warnings: z.array(importWarningSchema),
  saved: modelProfileSchema.nullable(),
});
export type ImportResponse = z.infer<typeof importResponseSchema>;

export const rotaryDimOf = (p: { headDim: number; partialRotaryFactor: number }) =>
  Math.round(p.headDim * p.partialRotaryFactor);

/** Bodies of the model-profile routes (server/features/models/models.router.ts). */
export const modelsListResponseSchema = z.object({ models: z.array(modelProfileSchema) });
export const modelResponseSchema = z.object({ model: modelProfileSchema });
export type ModelsListResponse = z.infer<typeof modelsListResponseSchema>;
/** DELETE /api/models/:id on a profile plans use: retired instead, with those plans. */
export const modelRetiredResponseSchema = z.object({
  retired: z.literal(true),
  model: modelProfileSchema,
  usedBy: z.array(z.object({ id: z.number().int(), title: z.string() })),
});
