import { z } from "zod";
import { bandsSchema, configPatchSchema, methodParamsSchema } from "../analysis";
import { revisionBudgetSchema } from "../budget";
import { pagedTotal } from "../common";
import { targetExportSchema } from "../exports";
import { layerGroupSchema } from "../models";
import { PROOF_STATES } from "../evidence-api";
import {
  acceptanceCriterionSchema,
  decisionSchema,
  extendsFromSchema,
  groupMethodSchema,
  revisionStateSchema,
  stageResultSchema,
  stageSchema,
  userRefSchema,
} from "./requests";

/*
 * Response bodies of /api/plans, as server/features/plans/{plans.router,plans.service,export.service,diff,workflow.service}.ts
 * write them. Requests are in requests.ts.
 */

const ref = z.object({ id: z.number(), name: z.string() });

export const planListItemSchema = z.object({
  id: z.number(),
  title: z.string(),
  purpose: z.string(),
  owner: ref,
  model: ref,
  requiredApprovals: z.number(),
  state: revisionStateSchema,
  latestRevision: z.number(),
  approvedRevision: z.number().nullable(),
  /** the approved revision's proof decision; null while it has none (or nothing is approved) */
  proof: z.enum(PROOF_STATES).nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type PlanListItem = z.infer<typeof planListItemSchema>;

export const planListResponseSchema = z.object({
  ...pagedTotal,
  /** Pass as `after` for the next page: keyset paging, as cheap at any depth (null on the last page). */
  nextAfter: z.string().nullable(),
  /** Pass as `before` for the previous page, by cursor like `nextAfter` (null on the first page). */
  prevBefore: z.string().nullable(),
  page: z.number(),
  pageSize: z.number(),
  plans: z.array(planListItemSchema),
});
export type PlanListResponse = z.infer<typeof planListResponseSchema>;

/** What every revision answer starts with: its number, state, edit version, decision round and hash. */
const revisionHead = {
  number: z.number(),
  state: revisionStateSchema,
  version: z.number(),
  round: z.number(),
  contentHash: z.string(),
  engineVersion: z.string(),
  /**
   * SHA-256 of the final block's rotary layout (docs/fingerprint.md): what the probe and every export carry. Null only
   * in plan listings for a revision older than fingerprints until the post-migration backfill has filled it.
   */
  rotaryFingerprint: z.string().nullable(),
};

export const revisionSummarySchema = z.object({
  ...revisionHead,
  author: userRefSchema.nullable().optional(),
  createdAt: z.string(),
  submittedAt: z.string().nullable(),
  decidedAt: z.string().nullable(),
  /** Approvals in the revision's current round. */
  approvals: z.number(),
  decisions: z.array(decisionSchema),
});
export type RevisionSummary = z.infer<typeof revisionSummarySchema>;

export const planDetailSchema = z.object({
  id: z.number(),
  title: z.string(),
  purpose: z.string(),
  owner: userRefSchema.nullable().optional(),
  model: ref.nullable(),
  requiredApprovals: z.number(),
  /** The plan's own count or the lab-wide minimum, whichever is higher. */
  effectiveRequiredApprovals: z.number(),
  state: revisionStateSchema,
  latestRevision: z.number(),
  approvedRevision: z.number().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
  revisions: z.array(revisionSummarySchema),
});
export type PlanDetail = z.infer<typeof planDetailSchema>;

/** The model profile's values frozen into a revision. */
export const modelSnapshotSchema = z.object({
  id: z.number(),
  name: z.string(),
  family: z.string(),
  headDim: z.number(),
  partialRotaryFactor: z.number(),
  ropeTheta: z.number(),
  trainedContext: z.number(),
  layers: z.number(),
  attentionHeads: z.number(),
  kvHeads: z.number(),
  hiddenSize: z.number(),
  parameters: z.number(),
  parametersTotal: z.number().nullable(),
  bytesPerElement: z.number(),
  /** The profile's layer groups, frozen with it; only present when the model has more than one. */
  layerGroups: z.array(layerGroupSchema).optional(),
  /**
   * Lineage (shared/lineage.ts): only for a model that ships scaling. trainedContext above is the pre-trained length;
   * this is the length served now and the shipped scaling as a method ("as shipped"), null when it cannot be run.
   */
  lineage: z.object({ servedContext: z.number(), shipped: methodParamsSchema.nullable() }).optional(),
  /** Multimodal sections (pairs per position axis), frozen with the profile; only present when it has them. */
  mropeSection: z.array(z.number()).optional(),
  mropeInterleaved: z.boolean().optional(),
});
export type ModelSnapshot = z.infer<typeof modelSnapshotSchema>;

/**
 * One layer group's frozen result: which layers, with which base and rotary dimension, the method the plan gives
 * them, and its flags. `checkedUpTo` is the longest distance the group's layers attend over: the plan target, or the
 * sliding window when that is shorter (keys beyond the window are masked, so those layers never see farther).
 */
export const groupResultSchema = stageResultSchema.extend({
  kind: z.string(),
  layers: z.array(z.number()),
  ropeTheta: z.number().nullable(),
  rotaryDim: z.number(),
  slidingWindow: z.number().nullable(),
  checkedUpTo: z.number(),
  scaled: z.boolean(),
});
export type GroupResult = z.infer<typeof groupResultSchema>;

export const revisionContentSchema = z.object({
  targetContext: z.number(),
  method: methodParamsSchema,
  /** Which length the plan extends from; absent on revisions from the pre-trained length (all before lineage). */
  extendsFrom: extendsFromSchema.optional(),
  groupMethods: z.array(groupMethodSchema).optional(),
  bands: bandsSchema.optional(),
  stages: z.array(stageSchema),
  acceptance: z.array(acceptanceCriterionSchema),
  notes: z.string(),
  engineVersion: z.string(),
  model: modelSnapshotSchema,
  results: z.object({
    rotaryDim: z.number(),
    criticalDimension: z.number(),
    criticalBase: z.number(),
    baseSupport: z.object({ supportedLength: z.number().nullable(), checkedUpTo: z.number(), complete: z.boolean() }),
    final: stageResultSchema,
    stages: z.array(stageResultSchema),
    /** Every layer group's result at the plan target (the scaled group repeats `final`); only for layered models. */
    groups: z.array(groupResultSchema).optional(),
  }),
  /** The budget sheet, frozen with the catalog numbers it used (schema owned by the budget contract). */
  budget: revisionBudgetSchema.optional(),
});
export type RevisionContent = z.infer<typeof revisionContentSchema>;

/**
 * A base the plan adopts (method "base"), with its complete supported length (Men et al. 2024 bound) scanned up to
 * the longest target a block using it has: `supportedLength` is the first failing position, null when none fails
 * below `target` (then `reachesTarget`). Kept beside the content, outside its hash (server/features/plans/base-support.ts).
 */
export const adoptedBaseSupportSchema = z.object({
  base: z.number(),
  target: z.number(),
  supportedLength: z.number().nullable(),
  reachesTarget: z.boolean(),
});
export type AdoptedBaseSupport = z.infer<typeof adoptedBaseSupportSchema>;

export const revisionResponseSchema = z.object({
  ...revisionHead,
  authorId: z.number(),
  content: revisionContentSchema,
  /** Every base the plan adopts, each with whether it reaches its target; empty when the plan keeps the model's base. */
  adoptedBases: z.array(adoptedBaseSupportSchema),
  /**
   * What is wrong with the blocks this revision signs as they stand (shared/frozen-block.ts revisionBlockCautions), in
   * the words each block's export carries: `stage` null for the plan target's block, n for `?stage=n`'s; a layer
   * group's block (carried by every export of the revision) has stage null and `group` its kind. Empty when there is
   * nothing to say.
   */
  blockCautions: z.array(
    z.object({
      stage: z.number().int().positive().nullable(),
      /** a layer group's block: its kind (layerGroups[].kind), stage null */
      group: z.string().optional(),
      code: z.string(),
      message: z.string(),
    }),
  ),
});
export type RevisionResponse = z.infer<typeof revisionResponseSchema>;

/** PUT a draft. */
export const draftSavedSchema = z.object({ number: z.number(), version: z.number(), contentHash: z.string() });
/** POST …/revisions: the new draft. */
export const newRevisionResponseSchema = z.object({ number: z.number(), version: z.number() });
/** submit, withdraw and decisions answer the revision's new state (withdraw also its version, decisions the approvals). */
export const transitionResponseSchema = z.object({
  number: z.number(),
  state: revisionStateSchema,
  version: z.number().optional(),
  approvals: z.number().optional(),
});

/** ok = hash intact, every approval of the current round signed it, every decision's signature verifies. */
export const verifyResponseSchema = z.object({
  number: z.number(),
  ok: z.boolean(),
  storedHash: z.string(),
  computedHash: z.string(),
  engineVersion: z.string(),
  hashIntact: z.boolean(),
  /** The server's current signing key id (GET /api/signing-key). */
  keyId: z.string(),
  /** One plain sentence per failed check; empty when ok. */
  problems: z.array(z.string()),
  decisions: z.array(decisionSchema.omit({ comment: true })),
});
export type VerifyResponse = z.infer<typeof verifyResponseSchema>;

const fieldChangeSchema = z.object({ path: z.string(), from: z.unknown(), to: z.unknown() });
export type FieldChange = z.infer<typeof fieldChangeSchema>;

export const diffResponseSchema = z.object({
  a: z.object({ number: z.number(), contentHash: z.string() }),
  b: z.object({ number: z.number(), contentHash: z.string() }),
  fields: z.array(fieldChangeSchema),
  stages: z.array(
    z.object({
      index: z.number(),
      change: z.enum(["added", "removed", "changed"]),
      fields: z.array(fieldChangeSchema),
    }),
  ),
  flags: z.array(
    z.object({ scope: z.string(), pair: z.number(), flag: z.string(), from: z.boolean(), to: z.boolean() }),
  ),
  budget: z.object({
    inputs: z.array(fieldChangeSchema),
    stages: z.array(
      z.object({
        index: z.number(),
        costFrom: z.number().nullable(),
        costTo: z.number().nullable(),
        costDelta: z.number(),
        hoursDelta: z.number(),
      }),
    ),
    totals: z
      .object({
        costFrom: z.number(),
        costTo: z.number(),
        costDelta: z.number(),
        /** The workspace currency each revision was costed in (null: costed before the setting existed). */
        currencyFrom: z.string().nullable(),
        currencyTo: z.string().nullable(),
      })
      .nullable(),
  }),
});
export type DiffResponse = z.infer<typeof diffResponseSchema>;

/** GET …/export and /approved/export: the signed configuration patch with who signed it. */
export const exportEnvelopeSchema = z.object({
  plan: z.object({ id: z.number(), title: z.string() }),
  revision: z.number(),
  state: revisionStateSchema,
  contentHash: z.string(),
  engineVersion: z.string(),
  model: z.object({ name: z.string(), trainedContext: z.number(), ropeTheta: z.number() }),
  /**
   * Lineage: which length the plan extends from and that length in tokens. `method` and `config` are as consumers
   * read them, over model.trainedContext (the pre-trained length), whichever length the plan extends from.
   */
  extendsFrom: extendsFromSchema.optional(),
  startContext: z.number().optional(),
  targetContext: z.number(),
  method: methodParamsSchema,
  config: configPatchSchema,
  attentionFactor: z.number(),
  /** `?stage=n`: the stage whose block this is (1-based); null for the plan's final target */
  stage: z.number().nullable(),
  /** the exported block's rotary fingerprint (docs/fingerprint.md) */
  fingerprint: z.string(),
  /** `?target=<id>`: that consumer's artifact (`text` is the exact file), its read-back and conformance */
  target: targetExportSchema.optional(),
  /** Layered models only: each layer group's block as signed (local layers as trained unless the plan says otherwise). */
  layerGroups: z
    .array(
      z.object({
        kind: z.string(),
        layers: z.array(z.number()),
        method: z.string(),
        attentionFactor: z.number(),
        ropeTheta: z.number().nullable(),
        config: configPatchSchema,
      }),
    )
    .optional(),
  /** Layered models only: the same groups as transformers v5's rope_parameters nested by layer type. */
  ropeParametersByLayerType: z.record(z.string(), z.record(z.string(), z.unknown())).optional(),
  /** The key that signed the decisions below (GET /api/signing-key serves its public half). */
  keyId: z.string(),
  /** Each approval of the exported round: `signature` is base64 Ed25519 over the RFC 8785 canonical JSON of `payload`. */
  signedBy: z.array(
    z.object({
      name: z.string(),
      email: z.string(),
      signedHash: z.string(),
      at: z.string(),
      keyId: z.string(),
      signature: z.string(),
      payload: z.object({
        planId: z.number(),
        revision: z.number(),
        contentHash: z.string(),
        approverId: z.number(),
        decision: z.string(),
        round: z.number(),
        time: z.string(),
      }),
    }),
  ),
  caution: z.string(),
  /**
   * What is wrong with this signed block as it stands (shared/frozen-block.ts): `frozen_config_lacks_sections` for a
   * revision of a model with multimodal sections signed before blocks carried them. `group` names a layer group's block
   * (layerGroups[].kind; its ropeParametersByLayerType entry too) when that is the one meant. Absent when there is
   * nothing to say.
   */
  cautions: z.array(z.object({ code: z.string(), group: z.string().optional(), message: z.string() })).optional(),
});
export type ExportEnvelope = z.infer<typeof exportEnvelopeSchema>;

export const reviewQueueItemSchema = z.object({
  planId: z.number(),
  title: z.string(),
  revision: z.number(),
  author: z.string(),
  submittedAt: z.string(),
  contentHash: z.string(),
  approvals: z.number(),
  requiredApprovals: z.number(),
});
export type ReviewQueueItem = z.infer<typeof reviewQueueItemSchema>;
export const reviewQueueResponseSchema = z.object({
  ...pagedTotal,
  page: z.number(),
  pageSize: z.number(),
  items: z.array(reviewQueueItemSchema),
});

/** GET /api/signing-key: the public half of the key that signs decisions. */
export const signingKeyResponseSchema = z.object({
  algorithm: z.literal("Ed25519"),
  keyId: z.string(),
  publicKeyPem: z.string(),
});
export type SigningKeyResponse = z.infer<typeof signingKeyResponseSchema>;

/** GET /api/plans/owners: everyone who owns at least one plan, by name (plans.list.ts planOwners). */
export const planOwnersResponseSchema = z.object({ owners: z.array(ref) });
export type PlanOwner = z.infer<typeof ref>;
