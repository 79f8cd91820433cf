import { z } from "zod";
import { bandsSchema, configPatchSchema, lengthSchema, methodParamsSchema } from "../analysis";
import { checkSettings, planBudgetFields } from "../budget";
import { contentHashSchema, dbIdParam, dbIdSchema, MAX_DB_ID } from "../common";
import { evidenceKindSchema } from "../evidence";
import { EXTENDS_FROM } from "../../lineage";

/** Which length of an already-scaled model a plan extends from (shared/lineage.ts); absent = the pre-trained one. */
export const extendsFromSchema = z.enum(EXTENDS_FROM);

export const REVISION_STATES = ["draft", "in_review", "approved", "changes_requested", "superseded"] as const;
export const revisionStateSchema = z.enum(REVISION_STATES);
export type RevisionState = z.infer<typeof revisionStateSchema>;
export const DECISIONS = ["approve", "request_changes"] as const;
/** valid; invalid (does not verify); missing (recorded before signing); unknown_key (signed by a key this server does not hold). */
export const SIGNATURE_STATUSES = ["valid", "invalid", "missing", "unknown_key"] as const;

const text = (max: number) => z.string().max(max);

/** One stage of a progressive extension. */
export const stageSchema = z.strictObject({
  targetContext: lengthSchema,
  method: methodParamsSchema,
  steps: z.number().int().positive().max(10_000_000),
  globalBatch: z.number().int().positive().max(1_000_000),
  sequenceLength: lengthSchema,
  learningRate: z.number().positive().max(1),
  dataMix: text(2000).default(""),
});
export type Stage = z.infer<typeof stageSchema>;
export type StageInput = z.input<typeof stageSchema>;

/**
 * The method for one layer group other than the scaled one (shared/layer-groups.ts scaledGroupIndex), named by the
 * group's kind. A group not listed keeps its trained frequencies: local-window layers stay as trained by default.
 */
export const groupMethodSchema = z.strictObject({
  kind: z.string().trim().min(1).max(80),
  method: methodParamsSchema,
});
export type GroupMethod = z.infer<typeof groupMethodSchema>;
const groupMethodsSchema = z.array(groupMethodSchema).max(64);

export const COMPARISONS = [">=", ">", "<=", "<"] as const;
export const acceptanceCriterionSchema = z.strictObject({
  evaluation: z.string().trim().min(1).max(200),
  contextLength: lengthSchema,
  metric: z.string().trim().min(1).max(120),
  comparison: z.enum(COMPARISONS),
  threshold: z.number().finite(),
  /**
   * What the criterion measures (issue 12; shared/schemas/evidence.ts). Optional only so criteria written before kinds
   * existed still read; such a criterion has no evidence to compare and lists as no_data.
   */
  kind: evidenceKindSchema.optional(),
  /** needle: minimum (default) or mean of the length × depth cells */
  aggregate: z.enum(["min", "mean"]).optional(),
  /** perplexity: the perplexity itself (default) or its ratio to the trained-length perplexity */
  measure: z.enum(["perplexity", "ratio"]).optional(),
  /** short_regression: the benchmarks that must not lose more than the threshold (default: all in the evidence) */
  benchmarks: z.array(z.string().trim().min(1).max(200)).max(50).optional(),
});
export type AcceptanceCriterion = z.infer<typeof acceptanceCriterionSchema>;

/** A plan's budget sheet inputs; stages come from the plan's own stages, the model from its snapshot. */
export const planBudgetSchema = z
  .strictObject(planBudgetFields)
  .superRefine((budget, ctx) => checkSettings(budget, ctx));
export type PlanBudgetInput = z.input<typeof planBudgetSchema>;

export const MAX_STAGES = 32;
const revisionFields = {
  targetContext: lengthSchema,
  method: methodParamsSchema,
  extendsFrom: extendsFromSchema.optional(),
  groupMethods: groupMethodsSchema.optional(),
  bands: bandsSchema.optional(),
  stages: z.array(stageSchema).max(MAX_STAGES, `at most ${MAX_STAGES} stages`).default([]),
  acceptance: z.array(acceptanceCriterionSchema).max(50).default([]),
  notes: text(20_000).default(""),
  budget: planBudgetSchema.optional(),
};
export const revisionInputSchema = z.strictObject(revisionFields);
export type RevisionInput = z.input<typeof revisionInputSchema>;
export type RevisionValues = z.output<typeof revisionInputSchema>;

export const createPlanRequestSchema = z.strictObject({
  title: z.string().trim().min(1).max(200),
  purpose: text(4000).default(""),
  modelId: dbIdSchema,
  requiredApprovals: z.number().int().min(1).max(3).optional(),
  revision: revisionInputSchema,
});
export type CreatePlanRequest = z.input<typeof createPlanRequestSchema>;

/** PUT a draft: any subset of the revision fields plus the version read last. */
export const updateRevisionRequestSchema = z.strictObject({
  version: dbIdSchema,
  targetContext: revisionFields.targetContext.optional(),
  method: methodParamsSchema.optional(),
  extendsFrom: extendsFromSchema.optional(),
  groupMethods: groupMethodsSchema.optional(),
  bands: bandsSchema.optional(),
  stages: z.array(stageSchema).max(MAX_STAGES, `at most ${MAX_STAGES} stages`).optional(),
  acceptance: z.array(acceptanceCriterionSchema).max(50).optional(),
  notes: text(20_000).optional(),
  budget: planBudgetSchema.nullable().optional(),
});
export type UpdateRevisionRequest = z.input<typeof updateRevisionRequestSchema>;

/** `contentHash` is the hash the approver read; a decision on any other content is refused (409 hash_mismatch). */
export const decisionRequestSchema = z.strictObject({
  decision: z.enum(DECISIONS),
  comment: text(4000).default(""),
  contentHash: contentHashSchema,
});

export const planSettingsSchema = z.strictObject({ minRequiredApprovals: z.number().int().min(1).max(3) });

export const planListQuerySchema = z.object({
  page: z.coerce.number().int().min(1).max(MAX_DB_ID).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
  sort: z.enum(["updatedAt", "createdAt", "title", "state", "owner", "model"]).default("updatedAt"),
  dir: z.enum(["asc", "desc"]).default("desc"),
  /**
   * Keyset paging: the plans after this cursor (the previous page's `nextAfter`, read under the same sort and
   * direction); `page` then only labels the page.
   */
  after: z
    .string()
    .regex(/^[A-Za-z0-9_-]{1,4000}$/, "a cursor from the previous page's nextAfter")
    .optional(),
  /**
   * Keyset paging backwards: the page of plans just before this cursor (the shown page's `prevBefore`), for "Previous
   * page" at any depth; `page` then only labels the page. Not with `after`.
   */
  before: z
    .string()
    .regex(/^[A-Za-z0-9_-]{1,4000}$/, "a cursor from the shown page's prevBefore")
    .optional(),
  state: revisionStateSchema.optional(),
  /** the approved revision's proof: proven, unproven, or none (approved, no proof decision yet) */
  proof: z.enum(["proven", "unproven", "none"]).optional(),
  ownerId: dbIdParam.optional(),
  modelId: dbIdParam.optional(),
  q: z.string().max(200).optional(),
});
export type PlanListQuery = z.input<typeof planListQuerySchema>;

// ---- stored content and responses ----

/** What the engine found for one stage (or the final target), stored with the revision, never recomputed on read. */
export const stageResultSchema = z.object({
  targetContext: z.number(),
  method: z.string(),
  params: z.record(z.string(), z.unknown()),
  attentionFactor: z.number(),
  summary: z.object({
    unseenAnglesPairs: z.number(),
    compressedResolutionPairs: z.number(),
    exceedsTrainedWindowPairs: z.number(),
  }),
  flags: z.object({
    unseenAngles: z.array(z.number()),
    compressedResolution: z.array(z.number()),
    exceedsTrainedWindow: z.array(z.number()),
  }),
  bands: z.array(z.string()),
  scaledWavelengths: z.array(z.number()),
  patch: configPatchSchema,
});
export type StageResult = z.infer<typeof stageResultSchema>;

export const userRefSchema = z.object({ id: z.number(), name: z.string(), email: z.string() });
export const decisionSchema = z.object({
  approver: userRefSchema,
  decision: z.enum(DECISIONS),
  comment: z.string(),
  signedHash: z.string(),
  round: z.number(),
  at: z.string(),
  /** Which server key signed it (SHA-256 of the public key's DER SubjectPublicKeyInfo, hex); null before signing existed. */
  keyId: z.string().nullable(),
  /** The server's Ed25519 signature over this decision, checked against the current key when read. */
  signatureStatus: z.enum(SIGNATURE_STATUSES),
});
export type Decision = z.infer<typeof decisionSchema>;
