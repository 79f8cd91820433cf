import { z } from "zod";
import { dbIdSchema } from "./common";
import { revisionBudgetV1Schema } from "./budget-v1";

/*
 * Budget contract: POST /api/budgets/estimate and the accelerator catalog.
 * Defaults are not applied here: the engine applies them and reports each in `assumptions.defaulted`.
 * z.number() already rejects NaN and ±Infinity; the upper limits keep every product finite.
 */

export const MAX_BUDGET_STAGES = 32;
export const MAX_SEQUENCE_LENGTH = 2 ** 27;
export const FLOP_CONVENTIONS = ["causal", "full"] as const;
export const BUDGET_RECIPE_IDS = ["position-interpolation", "yarn", "adjusted-base"] as const;

const count = (max: number) => z.number().int().positive().max(max);
const amount = (max: number) => z.number().positive().max(max);
/*
 * Lower bounds on the divisors of the estimate, so a denormal (5e-324) cannot make an hour, a cost or a KV-cache
 * count infinite (and the revision's canonical hash then refuses it). Each is far below any real value:
 * 1 GFLOP/s peak, 0.1 % utilisation, 1 bit per element.
 */
export const MIN_PEAK_FLOPS = 1e9;
export const MIN_UTILIZATION = 1e-3;
export const MIN_BYTES_PER_ELEMENT = 0.125;
/** A measured throughput below this (and any that implies under MIN_UTILIZATION) is refused, for the same reason. */
export const MIN_TOKENS_PER_SECOND = 1e-3;
const id = dbIdSchema;
const length = count(MAX_SEQUENCE_LENGTH);

// ---- accelerator catalog ----------------------------------------------------------------

const acceleratorFields = {
  name: z.string().trim().min(1).max(100),
  memoryBytes: count(1e15),
  /** Dense peak FLOP/s at the training precision (no sparsity figure). */
  peakFlops: amount(1e18).min(MIN_PEAK_FLOPS, `at least ${MIN_PEAK_FLOPS} FLOP/s`),
  /** Price per accelerator-hour, in the workspace's currency. */
  pricePerHour: z.number().nonnegative().max(1e6),
};

export const acceleratorInputSchema = z.object({ ...acceleratorFields, notes: z.string().max(2000).optional() });
export const acceleratorUpdateSchema = acceleratorInputSchema.partial();
/** `retiredAt`: when a used accelerator left the pickers (ISO time), or null while it is offered. */
export const acceleratorSchema = z.object({
  id,
  ...acceleratorFields,
  notes: z.string(),
  retiredAt: z.string().nullable(),
});
export type AcceleratorInput = z.infer<typeof acceleratorInputSchema>;
export type AcceleratorUpdate = z.infer<typeof acceleratorUpdateSchema>;
export type Accelerator = z.infer<typeof acceleratorSchema>;

// ---- request -----------------------------------------------------------------------------

/*
 * Either-or inputs are one object with a rule, not a z.union: when both variants of a union fail on a
 * type error (NaN, null, 2.5 where an integer goes) zod names only the object, never the field.
 */

/** Layer types whose cache holds every token (kinds come from a profile's layer groups; a window caps the rest). */
const layerGroupSchema = z.strictObject({
  /** The config's layer type, e.g. full_attention, sliding_attention; informative: the window decides. */
  kind: z.string().trim().min(1).max(80),
  /** How many layers, or their indices as a model profile lists them (shared/schemas/models.ts layerGroupSchema). */
  layers: z.union([count(10_000), z.array(z.number().int().nonnegative().max(10_000)).min(1).max(10_000)]),
  /** Tokens a local-window layer keeps; null or absent: the layer keeps the whole sequence. */
  slidingWindow: length.nullable().optional(),
});
export type LayerGroup = z.output<typeof layerGroupSchema>;

/** Fields a `{ modelId }` reference may still carry: what a stored profile may lack. */
const modelExtraFields = {
  /** Vocabulary size V: the logits are s·b·V fp32 values. */
  vocabSize: count(10_000_000).optional(),
  /** Layer groups of the model; absent: every layer is full attention. Their layers sum to `layers`. */
  layerGroups: z.array(layerGroupSchema).min(1).max(64).optional(),
  /** Latent attention: cached elements per token per layer (kv_lora_rank + qk_rope_head_dim); replaces 2·kvHeads·headDim. */
  kvLatentDim: count(1_000_000).nullable().optional(),
};

const modelShapeFields = {
  /** Used for both FLOPs (6N) and weight memory. */
  parameters: count(1e15),
  layers: count(10_000),
  attentionHeads: count(10_000),
  kvHeads: count(10_000),
  headDim: count(65_536),
  /** Residual width; default attentionHeads × headDim. */
  hiddenSize: count(1_000_000).optional(),
  /** Bytes per stored element of weights and activations (and KV cache unless kvCacheBytesPerElement); default 2. */
  bytesPerElement: amount(16).min(MIN_BYTES_PER_ELEMENT, "at least 0.125 (one bit)").optional(),
  ...modelExtraFields,
};
const REQUIRED_MODEL_FIELDS = ["parameters", "layers", "attentionHeads", "kvHeads", "headDim"] as const;

/** Layers in a group, given as a count or as the layers' indices. */
export const groupLayerCount = (g: { layers: number | number[] }) =>
  typeof g.layers === "number" ? g.layers : g.layers.length;

type HeadCounts = {
  attentionHeads?: number;
  kvHeads?: number;
  layers?: number;
  layerGroups?: { layers: number | number[] }[];
};
function checkKvGroups(model: HeadCounts, ctx: z.RefinementCtx) {
  if (model.attentionHeads !== undefined && model.kvHeads !== undefined && model.attentionHeads % model.kvHeads !== 0) {
    ctx.addIssue({ code: "custom", path: ["kvHeads"], message: "kvHeads must divide attentionHeads" });
  }
  if (model.layers === undefined || !model.layerGroups) return;
  const sum = model.layerGroups.reduce((total, g) => total + groupLayerCount(g), 0);
  if (sum !== model.layers) {
    ctx.addIssue({
      code: "custom",
      path: ["layerGroups"],
      message: `the groups' layers sum to ${sum}, the model has ${model.layers}`,
    });
  }
}

/** A model's shape on its own (strict: a misspelled field is an error, not silently dropped). */
export const budgetModelShapeSchema = z.strictObject(modelShapeFields).superRefine(checkKvGroups);
export type BudgetModelShape = z.output<typeof budgetModelShapeSchema>;

/**
 * `{ ...ref }` or the shape's fields, never both; the shape's `required` fields must all be there
 * when the ref is absent. Strict, so a misspelled field is an error.
 */
function refOrShape<R extends z.ZodRawShape, S extends z.ZodRawShape>(
  ref: R,
  shape: S,
  required: readonly string[],
  extras: readonly string[] = [],
) {
  const refKeys = Object.keys(ref);
  return z
    .strictObject({ ...ref, ...shape })
    .partial()
    .superRefine((value, ctx) => {
      const given = (key: string) => (value as Record<string, unknown>)[key] !== undefined;
      if (refKeys.some(given)) {
        for (const key of Object.keys(shape).filter((k) => given(k) && !extras.includes(k))) {
          ctx.addIssue({ code: "custom", path: [key], message: `give ${refKeys.join(", ")} or ${key}, not both` });
        }
        return;
      }
      for (const key of required.filter((k) => !given(k))) {
        ctx.addIssue({ code: "custom", path: [key], message: `required unless ${refKeys.join(", ")} is given` });
      }
    });
}

export type ModelExtras = Pick<BudgetModelShape, "vocabSize" | "layerGroups" | "kvLatentDim">;
/** A stored profile by id (with what the profile may lack), or the shape's fields. */
export type ModelRequest = ({ modelId: number } & ModelExtras) | BudgetModelShape;
export const budgetModelSchema = refOrShape(
  { modelId: id },
  modelShapeFields,
  REQUIRED_MODEL_FIELDS,
  Object.keys(modelExtraFields),
)
  .superRefine(checkKvGroups)
  .transform((model) => model as ModelRequest);

const clusterSpecFields = {
  peakFlops: acceleratorFields.peakFlops,
  memoryBytes: acceleratorFields.memoryBytes,
  pricePerHour: acceleratorFields.pricePerHour,
};
export const clusterSpecSchema = z.strictObject(clusterSpecFields);
export type ClusterRequest = { acceleratorId: number } | z.output<typeof clusterSpecSchema>;
export const budgetClusterSchema = refOrShape(
  { acceleratorId: id },
  clusterSpecFields,
  Object.keys(clusterSpecFields),
).transform((cluster) => cluster as ClusterRequest);

type StageCommon = { sequenceLength: number; globalBatch: number };
/** A stage by steps, or by a token target from which the engine derives steps. */
export type StageRequest =
  (StageCommon & { steps: number; tokens?: undefined }) | (StageCommon & { tokens: number; steps?: undefined });

// Steps or a token target: one object with an either-or rule, as above.
export const budgetStageRequestSchema = z
  .object({
    sequenceLength: length,
    /** Sequences per optimizer step, across all accelerators. */
    globalBatch: count(1e8),
    steps: count(1e9).optional(),
    tokens: amount(1e16).optional(),
  })
  .superRefine((stage, ctx) => {
    const hasSteps = stage.steps !== undefined;
    const hasTokens = stage.tokens !== undefined;
    if (hasSteps && hasTokens)
      ctx.addIssue({ code: "custom", path: ["tokens"], message: "give steps or tokens, not both" });
    if (!hasSteps && !hasTokens)
      ctx.addIssue({ code: "custom", path: ["steps"], message: "give steps or a token target" });
  })
  .transform((stage) => stage as StageRequest);

/** Ordered weakest to strongest: the engine's fit search (server/engine/budget/fit.ts) relies on this order. */
export const ACTIVATION_CHECKPOINTING = ["none", "selective", "full"] as const;
export type ActivationCheckpointing = (typeof ACTIVATION_CHECKPOINTING)[number];

/** Cluster size and training conventions: shared by the estimator and a plan's budget sheet. */
export const budgetSettingsFields = {
  accelerators: count(1_000_000),
  /** Model FLOPs utilisation in (0, 1]; ignored when measuredTokensPerSecond is given. */
  utilization: z.number().positive().min(MIN_UTILIZATION, "at least 0.001").max(1).optional(),
  convention: z.enum(FLOP_CONVENTIONS).optional(),
  /** What is kept for the backward pass (Korthikanti et al. 2022, Table 2); default full. */
  activationCheckpointing: z.enum(ACTIVATION_CHECKPOINTING).optional(),
  /** Fused attention: the a·s² attention scores are never stored; default true. */
  flashAttention: z.boolean().optional(),
  /** Degree over which each sequence is split, ring-attention style; default 1. */
  contextParallel: count(1_000_000).optional(),
  /** The loss computed over this many chunks of the sequence, so only one chunk's fp32 logits live at once; default 1. */
  lossChunks: count(1_000_000).optional(),
  /** Bytes per cached key/value element when serving (1 for an 8-bit cache); default the model's bytesPerElement. */
  kvCacheBytesPerElement: amount(16).min(MIN_BYTES_PER_ELEMENT, "at least 0.125 (one bit)").optional(),
  /** Measured training throughput, tokens per second per accelerator: utilisation is derived from it. */
  measuredTokensPerSecond: amount(1e9).min(MIN_TOKENS_PER_SECOND, `at least ${MIN_TOKENS_PER_SECOND}`).optional(),
  /** Sequence length the throughput was measured at; default the first stage's. */
  measuredSequenceLength: length.optional(),
  optimizerBytesPerParameter: amount(64).optional(),
  /** Sequences per micro-batch on one data-parallel rank; default 1. */
  microBatchSequences: count(1_000_000).optional(),
  /** Budget model 1's name for contextParallel, still accepted; give one of the two. */
  sequenceSharding: count(1_000_000).optional(),
  /** Budget model 1's recomputed fraction, still accepted: 0 means none, 1 means full; nothing in between. */
  recomputeFraction: z.number().min(0).max(1).optional(),
};

type SettingsSeen = {
  accelerators: number;
  contextParallel?: number;
  sequenceSharding?: number;
  recomputeFraction?: number;
  activationCheckpointing?: string;
};
/** Rules between settings: the old names against the new ones, and the degree against the cluster. */
export function checkSettings(settings: SettingsSeen, ctx: z.RefinementCtx, lengths: number[] = []) {
  const issue = (field: string, message: string) => ctx.addIssue({ code: "custom", path: [field], message });
  if (settings.contextParallel !== undefined && settings.sequenceSharding !== undefined)
    issue("sequenceSharding", "give contextParallel (its new name) or sequenceSharding, not both");
  if (settings.recomputeFraction !== undefined) {
    if (settings.activationCheckpointing !== undefined)
      issue("recomputeFraction", "give activationCheckpointing (its replacement) or recomputeFraction, not both");
    else if (settings.recomputeFraction !== 0 && settings.recomputeFraction !== 1)
      issue("recomputeFraction", "only 0 (none) or 1 (full) maps to activationCheckpointing; give that instead");
  }
  const degree = settings.contextParallel ?? settings.sequenceSharding;
  const field = settings.contextParallel !== undefined ? "contextParallel" : "sequenceSharding";
  if (degree === undefined) return;
  if (degree > settings.accelerators) issue(field, `${field} cannot exceed accelerators`);
  // Ring attention with causal masking balances work by cutting each sequence into 2 × degree equal chunks and
  // giving rank r chunks r and 2·degree − 1 − r (one early, one late): see docs/budget-conventions.md.
  const bad = degree > 1 ? lengths.findIndex((s) => s % (2 * degree) !== 0) : -1;
  if (bad >= 0)
    issue(
      field,
      `stage ${bad + 1}'s ${lengths[bad]} tokens do not divide by 2 × ${degree} = ${2 * degree}: each rank takes ` +
        "one early and one late chunk of 2 × degree equal chunks, so the causal work is balanced",
    );
}

/**
 * A plan's budget sheet inputs: the settings, the cluster, and the vocabulary size when the model profile does not
 * carry one (stages come from the plan, the model from its snapshot).
 */
export const planBudgetFields = {
  cluster: budgetClusterSchema,
  ...budgetSettingsFields,
  vocabSize: modelExtraFields.vocabSize,
};

export const budgetEstimateRequestSchema = z
  .object({
    model: budgetModelSchema,
    cluster: budgetClusterSchema,
    ...budgetSettingsFields,
    /** Growth curve start; default the shortest stage length. */
    trainedContext: length.optional(),
    /** Growth curve runs to 4 × this; default the longest stage length. */
    targetContext: length.optional(),
    /** Log-spaced growth points, both ends included; default 9. */
    growthPoints: z.number().int().min(2).max(64).optional(),
    stages: z.array(budgetStageRequestSchema).min(1).max(MAX_BUDGET_STAGES),
  })
  .superRefine((request, ctx) => {
    const lengths = request.stages.map((s) => s.sequenceLength);
    checkSettings(request, ctx, lengths);
    // Same fallbacks as the engine: shortest and longest stage lengths.
    const trained = request.trainedContext ?? Math.min(...lengths);
    const target = request.targetContext ?? Math.max(...lengths);
    if (trained > target) {
      const path = request.targetContext !== undefined ? "targetContext" : "trainedContext";
      ctx.addIssue({ code: "custom", path: [path], message: "trainedContext cannot exceed targetContext" });
    }
  });
export type BudgetEstimateRequest = z.input<typeof budgetEstimateRequestSchema>;
export type ParsedBudgetEstimateRequest = z.output<typeof budgetEstimateRequestSchema>;

// ---- response ----------------------------------------------------------------------------

const nonNegative = z.number().nonnegative();

/** The version of the memory and compute model; frozen revisions keep the version they were signed with. */
export const BUDGET_MODEL_VERSION = 2;
/** In this order: the engine names the first of equal largest terms (server/engine/budget/memory.ts). */
export const MEMORY_TERMS = ["modelStates", "activationCheckpoints", "recomputeWorkspace", "logits"] as const;
export const UTILIZATION_BASES = ["assumed", "measured"] as const;

/**
 * Each convention a sheet rests on, stated once; figures link to it by id (`#budget-convention-<id>`).
 * `basis`: a published source, a convention we state, or common practice without a source.
 */
export const BUDGET_CONVENTION_IDS = [
  "tokens",
  "flops",
  "checkpointing-flops",
  "utilisation",
  "cost",
  "model-states",
  "activations",
  "logits",
  "context-parallel",
  "fit",
  "kv-cache",
  "serving",
] as const;
export type BudgetConventionId = (typeof BUDGET_CONVENTION_IDS)[number];
export const budgetConventionSchema = z.object({
  id: z.enum(BUDGET_CONVENTION_IDS),
  title: z.string(),
  statement: z.string(),
  basis: z.enum(["published", "stated", "common practice"]),
  source: z.string().nullable(),
});

/** Per accelerator, bytes; the terms of Korthikanti et al. 2022 (Table 2) plus model states and logits. */
export const trainingMemorySchema = z.object({
  modelStates: nonNegative,
  activationCheckpoints: nonNegative,
  recomputeWorkspace: nonNegative,
  logits: nonNegative,
  total: nonNegative,
});

export const budgetStageEstimateSchema = z.object({
  index: z.number().int().nonnegative(),
  sequenceLength: z.number(),
  globalBatch: z.number(),
  steps: z.number(),
  /** The requested token target, or null when the stage was given by steps. */
  tokenTarget: z.number().nullable(),
  /** Tokens actually trained: steps × globalBatch × sequenceLength. */
  tokens: nonNegative,
  cumulativeTokens: nonNegative,
  /** Including the checkpointing recompute of the chosen mode. */
  flopsPerToken: nonNegative,
  /** The attention term of flopsPerToken, before any recompute. */
  attentionFlopsPerToken: nonNegative,
  flops: nonNegative,
  acceleratorHours: nonNegative,
  wallClockHours: nonNegative,
  cost: nonNegative,
  /** Whether hours and cost rest on an assumed utilisation or on the measured throughput. */
  utilizationBasis: z.enum(UTILIZATION_BASES),
  /** Cache bytes per token while every layer still holds every token (below the smallest window). */
  kvCacheBytesPerToken: nonNegative,
  /** One sequence at this stage's length, windows applied. */
  kvCacheBytesPerSequence: nonNegative,
  /** Whole sequences at this length whose cache fits beside one copy of the weights. */
  servingSequencesPerAccelerator: z.number().int().nonnegative(),
  trainingMemoryPerAccelerator: nonNegative,
  trainingMemory: trainingMemorySchema,
  fits: z.boolean(),
  largestMemoryTerm: z.enum(MEMORY_TERMS),
  /** When it does not fit: the cheapest settings that do (see the `fit` convention), or null when none does. */
  fitChange: z
    .object({
      activationCheckpointing: z.enum(ACTIVATION_CHECKPOINTING),
      contextParallel: z.number().int().positive(),
      lossChunks: z.number().int().positive(),
      total: nonNegative,
    })
    .nullable(),
  warnings: z.array(z.string()),
});

export const budgetTotalsSchema = z.object({
  tokens: nonNegative,
  flops: nonNegative,
  acceleratorHours: nonNegative,
  wallClockHours: nonNegative,
  cost: nonNegative,
});

export const budgetGrowthPointSchema = z.object({
  sequenceLength: z.number(),
  flopsPerToken: nonNegative,
  /** Share of flopsPerToken spent in the attention term. */
  attentionShare: z.number().min(0).max(1),
  acceleratorHoursPerBillionTokens: nonNegative,
  costPerBillionTokens: nonNegative,
});

export const budgetServingSchema = z.object({
  weightBytes: nonNegative,
  kvCacheBytesPerElement: nonNegative,
  /** The longest single sequence whose cache fits beside the weights on one accelerator (0: the weights do not fit). */
  longestServableContext: z.number().int().nonnegative(),
});

export const budgetAssumptionsSchema = z.object({
  convention: z.enum(FLOP_CONVENTIONS),
  conventionFormula: z.string(),
  conventionSource: z.string(),
  utilization: z.number(),
  utilizationBasis: z.enum(UTILIZATION_BASES),
  utilizationSource: z.string(),
  measuredTokensPerSecond: z.number().nullable(),
  measuredSequenceLength: z.number().nullable(),
  activationCheckpointing: z.enum(ACTIVATION_CHECKPOINTING),
  flashAttention: z.boolean(),
  contextParallel: z.number(),
  lossChunks: z.number(),
  dataParallelRanks: z.number(),
  optimizerBytesPerParameter: z.number(),
  optimizerBytesSource: z.string(),
  bytesPerElement: z.number(),
  kvCacheBytesPerElement: z.number(),
  hiddenSize: z.number(),
  /** null: not given, so the logits are not counted (a warning says so). */
  vocabSize: z.number().nullable(),
  microBatchSequences: z.number(),
  trainedContext: z.number(),
  targetContext: z.number(),
  /** Inputs that were left out and took their default. */
  defaulted: z.array(z.string()),
  /** Each convention once; figures link to them by id. */
  conventions: z.array(budgetConventionSchema),
});

export const budgetEstimateSchema = z.object({
  budgetModel: z.literal(BUDGET_MODEL_VERSION),
  stages: z.array(budgetStageEstimateSchema),
  totals: budgetTotalsSchema,
  growth: z.array(budgetGrowthPointSchema),
  serving: budgetServingSchema,
  assumptions: budgetAssumptionsSchema,
});
export type BudgetEstimateResponse = z.infer<typeof budgetEstimateSchema>;

// ---- published recipes (GET, read-only) --------------------------------------------------

export const budgetRecipeSchema = z.object({
  id: z.enum(BUDGET_RECIPE_IDS),
  name: z.string(),
  source: z.object({ authors: z.string(), year: z.number().int(), title: z.string() }),
  reported: z.object({
    steps: z.number().optional(),
    globalBatch: z.number().optional(),
    learningRate: z.number().optional(),
    sequenceLength: z.number().optional(),
    tokens: z.number().optional(),
  }),
  /** Plain words on what the figures are. */
  summary: z.string(),
});
export type BudgetRecipeResponse = z.infer<typeof budgetRecipeSchema>;

// ---- response envelopes (as the routers send them) ----------------------------------------

export const acceleratorListResponseSchema = z.object({ accelerators: z.array(acceleratorSchema) });
export const acceleratorResponseSchema = z.object({ accelerator: acceleratorSchema });
/** DELETE /api/accelerators/:id on an accelerator plans were costed on: retired instead, with those plans. */
export const acceleratorRetiredResponseSchema = z.object({
  retired: z.literal(true),
  accelerator: acceleratorSchema,
  usedBy: z.array(z.object({ id, title: z.string() })),
});

export const budgetRecipesResponseSchema = z.object({ recipes: z.array(budgetRecipeSchema), caution: z.string() });

/** ISO 4217 code of the workspace currency every price and cost is in. */
export const currencySchema = z
  .string()
  .trim()
  .regex(/^[A-Z]{3}$/, "three capital letters, an ISO 4217 code such as EUR");
export const workspaceCurrencySchema = z.strictObject({ currency: currencySchema });

/** POST /api/budgets/estimate: the estimate plus the numbers that `modelId` / `acceleratorId` stood for. */
export const budgetEstimateResultSchema = budgetEstimateSchema.extend({
  /** The workspace currency of `pricePerHour` and every cost. */
  currency: z.string(),
  resolved: z.object({
    model: z.object(modelShapeFields),
    cluster: clusterSpecSchema,
    acceleratorName: z.string().nullable(),
  }),
});
export type BudgetEstimateResult = z.infer<typeof budgetEstimateResultSchema>;

/** A plan's budget inputs as stored in a revision (same fields as plans' planBudgetSchema). */
const storedBudgetInputsSchema = z.object(planBudgetFields);

/**
 * `content.budget` of a plan revision: the figures with the catalog numbers and the currency copied in at edit
 * time, or why they were skipped (a plan with no stages). Revisions frozen under budget model 1 keep that shape.
 */
export const revisionBudgetV2Schema = z.union([
  z.object({
    budgetModel: z.literal(BUDGET_MODEL_VERSION),
    inputs: storedBudgetInputsSchema,
    cluster: z.object({ name: z.string().nullable(), ...clusterSpecFields }),
    currency: z.string(),
    estimate: budgetEstimateSchema,
  }),
  z.object({ budgetModel: z.literal(BUDGET_MODEL_VERSION), inputs: storedBudgetInputsSchema, skipped: z.string() }),
]);
export type RevisionBudgetV2 = z.infer<typeof revisionBudgetV2Schema>;
export const revisionBudgetSchema = z.union([revisionBudgetV2Schema, revisionBudgetV1Schema]);
export type RevisionBudget = z.infer<typeof revisionBudgetSchema>;
/** Budget model 1 stored no version; those revisions are read and shown with their own schema. */
export const isBudgetV2 = (b: RevisionBudget): b is RevisionBudgetV2 => "budgetModel" in b && b.budgetModel === 2;
