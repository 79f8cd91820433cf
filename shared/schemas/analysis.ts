import { z } from "zod";
import { EXPORT_ROPE_TYPES, METHOD_IDS, METHOD_SCHEMAS, METHODS_NEEDING_EXTENSION, type MethodId } from "../methods";
import { lengthSchema, MAX_HEAD_DIM, positive } from "../methods/params";
import { dbIdSchema } from "./common";
import { mropeSectionSchema } from "./models";

/**
 * Contract of POST /api/analyses: which rotary scaling methods to compare on one model.
 * The engine (server/engine) and the client forms both use these schemas; each method's own member,
 * names and defaults live in its catalog entry (shared/methods/catalog.ts).
 */

export { METHOD_IDS, METHODS_NEEDING_EXTENSION, type MethodId };
export const methodIdSchema = z.enum(METHOD_IDS);

export { MAX_LENGTH, MAX_HEAD_DIM, MAX_FACTOR_LIST, lengthSchema } from "../methods/params";
/**
 * Request limits of POST /api/analyses, so one request cannot ask for tens of megabytes of pair tables:
 * head dim at most MAX_HEAD_DIM (1024), longrope factor lists at most MAX_FACTOR_LIST (512) entries
 * (both in shared/methods/params.ts), and at most 12 methods per request: one of each kind (8 today) with room
 * for more, or several settings of a few. At these limits a response is about 2 MB (it was 20 MB at head dim
 * 8192, 16 methods and 4096 factors); analyses above ANALYSIS_INLINE_WORK run off the event loop.
 */
export const MAX_METHODS = 12;
/** Pairs × methods up to which an analysis is computed in the request itself (a few milliseconds). */
export const ANALYSIS_INLINE_WORK = 512;

/** The shape the rotary engine reads (analyses): head size, base and trained window; the rest optional. Not the budget's budgetModelShapeSchema. */
export const rotaryShapeSchema = z.strictObject({
  headDim: z.number().int().positive().max(MAX_HEAD_DIM, `at most ${MAX_HEAD_DIM}`),
  ropeTheta: z.number().gt(1, "the base must exceed 1").max(1e15),
  trainedContext: lengthSchema,
  partialRotaryFactor: z.number().gt(0, "must be above 0").max(1, "must be at most 1").optional(),
  layers: z.number().int().positive().max(10_000).optional(),
  attentionHeads: z.number().int().positive().max(10_000).optional(),
  kvHeads: z.number().int().positive().max(10_000).optional(),
  hiddenSize: z.number().int().positive().max(1_000_000).optional(),
  /**
   * Multimodal sections (pairs per position axis) and their layout flag, when the model has them. They change no
   * number the engine computes; the config patch carries them, since the model reads them on every step
   * (shared/mrope-axes.ts, MROPE_KEYS).
   */
  mropeSection: mropeSectionSchema.optional(),
  mropeInterleaved: z.boolean().optional(),
});
export type ModelShape = z.infer<typeof rotaryShapeSchema>;
export const modelRefSchema = z.strictObject({ modelId: dbIdSchema });

/** Rotary dimension d = headDim × partialRotaryFactor; null unless it is a positive even integer. */
export function rotaryDimension(model: Pick<ModelShape, "headDim" | "partialRotaryFactor">): number | null {
  const raw = model.headDim * (model.partialRotaryFactor ?? 1);
  const d = Math.round(raw);
  if (Math.abs(raw - d) > 1e-9 || d <= 0 || d % 2 !== 0) return null;
  return d;
}

/** One member per method (the catalog entries' schemas): the validation table. Optional fields get their defaults in the engine. */
export const methodParamsSchema = z.discriminatedUnion("method", METHOD_SCHEMAS);
export type MethodParams = z.infer<typeof methodParamsSchema>;
export type ParamsOf<K extends MethodId> = Extract<MethodParams, { method: K }>;

export const bandsSchema = z
  .strictObject({ alpha: positive, beta: positive })
  .refine((b) => b.beta > b.alpha, { path: ["beta"], message: "beta must exceed alpha" });
export type Bands = z.infer<typeof bandsSchema>;
export const DEFAULT_BANDS: Bands = { alpha: 1, beta: 32 };

interface FieldIssue {
  path: (string | number)[];
  message: string;
}

/** Rules that need the model: rotary dimension, target above trained context, longrope list lengths. */
export function modelDependentIssues(model: ModelShape, targetContext: number, methods: MethodParams[]): FieldIssue[] {
  const issues: FieldIssue[] = [];
  const d = rotaryDimension(model);
  if (d === null) {
    const field =
      model.partialRotaryFactor !== undefined && model.partialRotaryFactor !== 1 ? "partialRotaryFactor" : "headDim";
    const raw = model.headDim * (model.partialRotaryFactor ?? 1);
    issues.push({
      path: ["model", field],
      message: `rotary dimension headDim × partialRotaryFactor = ${raw} must be a positive even integer`,
    });
  }
  const needs = methods.findIndex((m) => METHODS_NEEDING_EXTENSION.includes(m.method));
  if (needs >= 0 && !(targetContext > model.trainedContext)) {
    issues.push({
      path: ["targetContext"],
      message: `must exceed the trained context (${model.trainedContext}) for method ${methods[needs].method} (methods.${needs})`,
    });
  }
  methods.forEach((m, i) => {
    if (m.method !== "longrope" || d === null) return;
    for (const key of ["longFactor", "shortFactor"] as const) {
      if (m[key].length !== d / 2)
        issues.push({
          path: ["methods", i, key],
          message: `needs ${d / 2} entries (rotary dimension / 2), got ${m[key].length}`,
        });
    }
  });
  return issues;
}

const requestFields = {
  targetContext: lengthSchema,
  bands: bandsSchema.optional(),
  methods: z
    .array(methodParamsSchema)
    .min(1, "pick at least one method")
    .max(MAX_METHODS, `at most ${MAX_METHODS} methods`),
};

/** The request the engine runs: model already resolved. */
export const resolvedAnalysisRequestSchema = z
  .object({ model: rotaryShapeSchema, ...requestFields })
  .superRefine((r, ctx) =>
    modelDependentIssues(r.model, r.targetContext, r.methods).forEach((i) => ctx.addIssue({ code: "custom", ...i })),
  );
export type ResolvedAnalysisRequest = z.infer<typeof resolvedAnalysisRequestSchema>;

export type ModelRef = z.infer<typeof modelRefSchema>;

/**
 * An inline model shape or a stored model's id, chosen by the presence of `modelId`, so that every bad value
 * is reported on its own field (model.ropeTheta …) rather than as one failed union.
 */
export const modelInputSchema = z.unknown().transform((value, ctx): ModelRef | ModelShape => {
  const byId = typeof value === "object" && value !== null && "modelId" in value;
  const parsed = (byId ? modelRefSchema : rotaryShapeSchema).safeParse(value);
  if (parsed.success) return parsed.data;
  for (const issue of parsed.error.issues) ctx.addIssue({ code: "custom", path: issue.path, message: issue.message });
  return z.NEVER;
});

/**
 * How the answer is laid out: "rows" (the default, one object per pair) or "columns" (the same numbers, one array
 * per field and nothing repeated: shared/schemas/analysis-columns.ts).
 */
export const analysisFormSchema = z.enum(["rows", "columns"]);

/** The HTTP request. Model-dependent rules run here for an inline shape, and after lookup for { modelId }. */
export const analysisRequestSchema = z
  .object({
    model: modelInputSchema,
    ...requestFields,
    form: analysisFormSchema.optional(),
  })
  .superRefine((r, ctx) => {
    if ("modelId" in r.model) return;
    modelDependentIssues(r.model, r.targetContext, r.methods).forEach((i) => ctx.addIssue({ code: "custom", ...i }));
  });
export type AnalysisRequest = z.infer<typeof analysisRequestSchema>;

// ---- response ----

/**
 * Our names for the three kinds of pair, by rotations r = L/λ inside the trained window (α, β from the request):
 * - "spinning" (r ≥ β): cycled many times in training and saw every angle; the trade calls these high-frequency.
 *   Slowing them blurs neighbouring positions (the local-resolution cost of position interpolation).
 * - "turning" (α ≤ r < β): a few rotations; methods blend between keeping and interpolating these.
 * - "drifting" (r < α): never completed a rotation in training (low-frequency); extrapolating them
 *   reaches angles the model never saw, so context-extension methods interpolate them.
 */
export const BAND_IDS = ["spinning", "turning", "drifting"] as const;
export type Band = (typeof BAND_IDS)[number];

const num = z.number();
export const pairResultSchema = z.object({
  index: z.number().int(),
  invFreq: num,
  scaledInvFreq: num,
  wavelength: num,
  scaledWavelength: num,
  rotationsInTrainedWindow: num,
  band: z.enum(BAND_IDS),
  exceedsTrainedWindow: z.boolean(),
  unseenAngles: z.boolean(),
  compressedResolution: z.boolean(),
});
export type PairResult = z.infer<typeof pairResultSchema>;

/**
 * The multimodal section keys a block carries for a model that has sections (shared/mrope-axes.ts, MROPE_KEYS), and
 * `type` beside `rope_type` with the same value. Why `type`: the 4.x multimodal config classes overwrite `rope_type`
 * with `type` whenever the block has one (mrope read as default): huggingface/transformers
 * src/transformers/models/qwen2_vl/configuration_qwen2_vl.py at 4efabc6e, Qwen2VLConfig.__init__. A block merged
 * (RFC 7396) onto a config whose block says `type: "mrope"` would otherwise run as default RoPE; writing `type: null`
 * instead would remove it on a merge but, for a consumer that replaces `rope_scaling` whole, leave a `type` of None
 * that the same lines copy into `rope_type`. The same value under both names runs the same method on every line:
 * v5 takes `rope_type` first, and the 4.x validators at most log `type` as an unrecognized key (modeling_rope_utils.py
 * `_check_received_keys`, read through stored copies; the shipped multimodal configs, whose class writes both keys,
 * draw the same line).
 */
const sectionKeyFields = {
  type: z.enum(EXPORT_ROPE_TYPES).optional(),
  mrope_section: z.array(z.number().int()).optional(),
  mrope_interleaved: z.boolean().optional(),
};

/** `rope_scaling` in the open model-configuration convention (snake_case keys, as loaders read them). */
export const ropeScalingBlockSchema = z.object({
  rope_type: z.enum(EXPORT_ROPE_TYPES),
  factor: num,
  original_max_position_embeddings: z.number().int(),
  beta_fast: num.optional(),
  beta_slow: num.optional(),
  truncate: z.boolean().optional(),
  attention_factor: num.optional(),
  mscale: num.optional(),
  mscale_all_dim: num.optional(),
  low_freq_factor: num.optional(),
  high_freq_factor: num.optional(),
  long_factor: z.array(num).optional(),
  short_factor: z.array(num).optional(),
  ...sectionKeyFields,
});
export type RopeScalingBlock = z.infer<typeof ropeScalingBlockSchema>;

/**
 * Plain RoPE (or a new base) on a model with multimodal sections: a `default` block that holds only the sections, so
 * applying the patch keeps them (a null `rope_scaling` would delete them and the model reads them every step).
 */
export const sectionsOnlyBlockSchema = z.strictObject({
  rope_type: z.literal("default"),
  type: z.literal("default"),
  mrope_section: z.array(z.number().int()),
  mrope_interleaved: z.boolean().optional(),
});
export type SectionsOnlyBlock = z.infer<typeof sectionsOnlyBlockSchema>;

/**
 * The keys to write into config.json: rope_scaling (null for none, the sections-only block for none on a model with
 * sections), rope_theta only when the base changes.
 */
export const configPatchSchema = z.object({
  rope_scaling: z.union([ropeScalingBlockSchema, sectionsOnlyBlockSchema]).nullable(),
  rope_theta: num.optional(),
  max_position_embeddings: z.number().int(),
});
export type ConfigPatch = z.infer<typeof configPatchSchema>;

/** Liu et al. 2023, Theorem 3, for one base tuned at one length. */
export const extrapolationBoundSchema = z.object({
  base: num,
  tuneContext: num,
  criticalBase: num,
  baseAboveCritical: z.boolean(),
  tExtra: num,
  bound: num,
});
export type ExtrapolationBound = z.infer<typeof extrapolationBoundSchema>;

/**
 * Men et al. 2024 for the original base over the target window: supportedLength is the first m < targetContext
 * with Σ cos(m·θ_i) < 0 (null: none found). The analysis scans with a budget; when `complete` is false only
 * positions below checkedUpTo are known, and POST /api/bounds/base gives the full answer.
 */
export const baseSupportSchema = z.object({
  base: num,
  supportedLength: z.number().int().nullable(),
  checkedUpTo: z.number().int(),
  complete: z.boolean(),
  supportsTarget: z.boolean().nullable(),
});

export const methodResultSchema = z.object({
  method: methodIdSchema,
  params: methodParamsSchema,
  attentionFactor: num,
  /** The base the scaled frequencies correspond to, for methods that only change the base; else null. */
  effectiveBase: num.nullable(),
  pairs: z.array(pairResultSchema),
  summary: z.object({
    unseenAnglesPairs: z.number().int(),
    compressedResolutionPairs: z.number().int(),
    exceedsTrainedWindowPairs: z.number().int(),
  }),
  extrapolationBound: extrapolationBoundSchema.nullable(),
  ropeScaling: configPatchSchema,
  notes: z.array(z.string()),
});
export type MethodResult = z.infer<typeof methodResultSchema>;

export const analysisResponseSchema = z.object({
  engineVersion: z.string(),
  model: rotaryShapeSchema.extend({ rotaryDim: z.number().int(), pairs: z.number().int(), partialRotaryFactor: num }),
  targetContext: z.number().int(),
  scale: num,
  bands: z.object({ alpha: num, beta: num }),
  criticalDimension: z.number().int(),
  criticalBase: num,
  extrapolationBound: extrapolationBoundSchema,
  baseSupport: baseSupportSchema,
  methods: z.array(methodResultSchema),
  decay: z.object({ positions: z.array(num), original: z.array(num), byMethod: z.record(z.string(), z.array(num)) }),
});
export type AnalysisResponse = z.infer<typeof analysisResponseSchema>;
