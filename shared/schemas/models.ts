import { z } from "zod";
import { MAX_DB_ID, pagedTotal, pageQuerySchema } from "./common";

/** Lengths are stored in PostgreSQL integer columns, so at most 2^31 − 1. */
const MAX_LEN = MAX_DB_ID;
const finite = () => z.number().finite();
const posInt = (max = MAX_LEN) => z.number().int().positive().max(max);
/** Multimodal rotary sections: pairs per position axis (shared/mrope-axes.ts). */
export const mropeSectionSchema = z.array(posInt(4096)).min(1).max(8);

/** A method and its parameters as a profile's "current scaling" (read from a config's rope_scaling block). */
export const currentScalingSchema = z.object({
  method: z.string(),
  params: z.record(z.string(), z.unknown()),
  raw: z.record(z.string(), z.unknown()),
});
export type CurrentScaling = z.infer<typeof currentScalingSchema>;

/**
 * One set of layers that share a rotary setting. `kind` is the config's layer type (`full_attention`,
 * `sliding_attention`, …) or `no_rope` for layers without any position encoding (never scaled: ropeTheta null,
 * rotaryDim 0). `layers` are 0-based layer indices; `currentScaling` is null when the group runs unscaled.
 */
export const layerGroupSchema = z.object({
  kind: z.string().trim().min(1).max(80),
  layers: z.array(z.number().int().nonnegative().max(10_000)).min(1).max(10_000),
  ropeTheta: finite().gt(1, "must be above 1").max(1e15).nullable(),
  rotaryDim: z.number().int().nonnegative().max(4096),
  slidingWindow: posInt().nullable(),
  currentScaling: currentScalingSchema.nullable(),
});
export type LayerGroup = z.infer<typeof layerGroupSchema>;

const profileFields = z.object({
  name: z.string().trim().min(1).max(120),
  family: z.string().trim().min(1).max(80),
  headDim: posInt(4096),
  partialRotaryFactor: finite().gt(0, "must be above 0").lte(1, "must be at most 1").default(1),
  ropeTheta: finite().gt(1, "must be above 1").max(1e15),
  trainedContext: posInt(),
  maxPositionEmbeddings: posInt().nullable().optional(),
  /**
   * Lineage: the length the model is served at now. For a model that ships scaling it is longer than
   * trainedContext, which stays the length its base was pre-trained at (the L every consumer's formula uses).
   * Null or absent: served at max_position_embeddings, else at the trained length.
   */
  servedContext: posInt().nullable().optional(),
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
  /** Per-layer-type rotary settings; null or absent means one full_attention group over every layer. */
  layerGroups: z.array(layerGroupSchema).min(1).max(64).nullable().optional(),
  /** Multimodal rotary sections (pairs per position axis), or null for text-only rotary. */
  mropeSection: mropeSectionSchema.nullable().optional(),
  /** Whether the sections' pairs interleave (t, h, w, t, h, w, …) instead of lying in contiguous blocks. */
  mropeInterleaved: z.boolean().optional(),
  /** Latent attention: the cached width per token and layer (kv_lora_rank + qk_rope_head_dim), or null. */
  kvLatentDim: posInt(1_000_000).nullable().optional(),
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
  for (const [i, g] of (v.layerGroups ?? []).entries()) {
    if (g.layers.some((l) => l >= v.layers))
      ctx.addIssue({
        code: "custom",
        path: ["layerGroups", i, "layers"],
        message: `layer indices must be below ${v.layers}`,
      });
    if (g.rotaryDim % 2 !== 0 || g.rotaryDim > v.headDim)
      ctx.addIssue({
        code: "custom",
        path: ["layerGroups", i, "rotaryDim"],
        message: `must be an even number of dimensions, at most headDim ${v.headDim}`,
      });
  }
  if (v.parametersTotal != null && v.parametersTotal < v.parameters)
    ctx.addIssue({ code: "custom", path: ["parametersTotal"], message: "cannot be below the non-embedding count" });
}

export const modelProfileInputSchema = profileFields.superRefine(checkShape);
export type ModelProfileInput = z.input<typeof modelProfileInputSchema>;
export type ModelProfileValues = z.output<typeof modelProfileInputSchema>;

export const importWarningSchema = z.object({ code: z.string(), message: z.string(), fix: z.string() });
export type ImportWarning = z.infer<typeof importWarningSchema>;

export const modelProfileSchema = profileFields.extend({
  layerGroups: z.array(layerGroupSchema),
  mropeSection: z.array(z.number().int()).nullable(),
  mropeInterleaved: z.boolean(),
  kvLatentDim: z.number().int().nullable(),
  /** Lineage (shared/lineage.ts): the length the base was pre-trained at (= trainedContext) and the one served now. */
  pretrainedContext: z.number().int(),
  servedContext: z.number().int(),
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
    /** Lineage: the length the base was pre-trained at (what trainedContext holds) and the length served now. */
    pretrainedContext: finite(),
    servedContext: finite().nullable(),
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
    /** The dimension that rotates (qk_rope_head_dim, head_dim × partial_rotary_factor or rotary_pct). */
    rotaryDim: finite(),
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

/**
 * GET /api/models: one page by name (50 by default). `q` keeps profiles whose name contains it (the pickers' search
 * box); `retired=exclude` leaves retired profiles out (pickers), `include` (the default) lists them too.
 */
export const modelsListQuerySchema = pageQuerySchema(50).extend({
  q: z.string().trim().max(120).optional(),
  retired: z.enum(["include", "exclude"]).default("include"),
});
export type ModelsListQuery = z.infer<typeof modelsListQuerySchema>;

/** Bodies of the model-profile routes (server/features/models/models.router.ts). */
export const modelsListResponseSchema = z.object({
  models: z.array(modelProfileSchema),
  ...pagedTotal,
  page: z.number(),
  pageSize: z.number(),
});
export const modelResponseSchema = z.object({ model: modelProfileSchema });
export type ModelsListResponse = z.infer<typeof modelsListResponseSchema>;
/** DELETE /api/models/:id on a profile plans use: retired instead, with those plans. */
export const modelRetiredResponseSchema = z.object({
  retired: z.literal(true),
  model: modelProfileSchema,
  usedBy: z.array(z.object({ id: z.number().int(), title: z.string() })),
});
