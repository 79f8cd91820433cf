import { z } from "zod";
import { contentHashSchema, dbIdSchema, SHA256_HEX } from "./common";
import { EVIDENCE_KINDS, evidenceKindSchema, provenanceBucketSchema } from "./evidence";

/**
 * The evidence routes (issue 12, a fixed contract): upload, listing with each criterion's verdict, and the proof
 * decision that follows approval. Proof is rope-makers' language: a rope is proof-tested before it goes into service.
 */
export const PROOF_STATES = ["proven", "unproven"] as const;
export type ProofState = (typeof PROOF_STATES)[number];
export const PROOF_LABELS: Record<ProofState, string> = { proven: "Proven", unproven: "Not proven" };

/** What the harness actually did: a criterion whose bucket is short of its length is `insufficient`. */
export const provenanceSchema = z.strictObject({
  engine: z.string().trim().min(1).max(120),
  engineVersion: z.string().trim().min(1).max(120),
  tokenizer: z.string().trim().min(1).max(300),
  chatTemplate: z.string().trim().max(300),
  truncation: z.enum(["left", "right", "none"]),
  generationBudget: z.number().int().nonnegative().max(1_000_000),
  buckets: z.array(provenanceBucketSchema).max(200).default([]),
});
export type Provenance = z.infer<typeof provenanceSchema>;

export const fingerprintSchema = z
  .string()
  .regex(SHA256_HEX, "the rotary fingerprint: 64 lowercase hex characters (docs/fingerprint.md)");

/** The multipart text parts beside `file` (documented in OpenAPI). */
export const evidenceFormSchema = z.object({
  file: z.string().describe("the evaluation results: our CSV for the kind, or the harness results JSON"),
  kind: z.enum(EVIDENCE_KINDS),
  fingerprint: z.string().describe("rotary fingerprint of the model that was run"),
  provenance: z
    .string()
    .describe("JSON: engine, engineVersion, tokenizer, chatTemplate, truncation, generationBudget, buckets"),
});

export const evidenceSchema = z.object({
  id: z.number(),
  revision: z.number(),
  kind: evidenceKindSchema,
  fileName: z.string(),
  format: z.enum(["csv", "harness"]),
  checksum: z.string(),
  bytes: z.number(),
  rows: z.array(z.record(z.string(), z.union([z.string(), z.number()]))),
  fingerprint: z.string(),
  provenance: provenanceSchema,
  by: z.object({ id: z.number(), name: z.string() }),
  via: z.enum(["session", "token"]),
  at: z.string(),
});
export type Evidence = z.infer<typeof evidenceSchema>;
export const evidenceUploadResponseSchema = z.object({ evidence: evidenceSchema });

export const CRITERION_STATUSES = ["pass", "fail", "no_data", "insufficient"] as const;
export const criterionVerdictSchema = z.object({
  index: z.number(),
  kind: evidenceKindSchema.nullable(),
  evaluation: z.string(),
  contextLength: z.number(),
  comparison: z.string(),
  threshold: z.number(),
  status: z.enum(CRITERION_STATUSES),
  observed: z.number().nullable(),
  reason: z.string(),
  evidenceIds: z.array(z.number()),
  /** provenance shortfalls, one line per upload that fell short (the status is insufficient when any did) */
  warnings: z.array(z.string()),
  effectiveLength: z.number().nullable().optional(),
  trainedPerplexity: z.number().nullable().optional(),
});
export type CriterionVerdict = z.infer<typeof criterionVerdictSchema>;

export const proofSchema = z.object({
  id: z.number(),
  verdict: z.enum(PROOF_STATES),
  reason: z.string(),
  contentHash: z.string(),
  evidenceIds: z.array(z.number()),
  by: z.object({ id: z.number(), name: z.string() }),
  at: z.string(),
  signatureStatus: z.enum(["valid", "invalid", "missing", "unknown_key"]),
  keyId: z.string(),
});
export type Proof = z.infer<typeof proofSchema>;

export const evidenceListResponseSchema = z.object({
  revision: z.number(),
  state: z.string(),
  proof: z.enum(PROOF_STATES).nullable(),
  trainedContext: z.number(),
  targetContext: z.number(),
  rotaryFingerprint: z.string().nullable(),
  contentHash: z.string(),
  evidence: z.array(evidenceSchema),
  criteria: z.array(criterionVerdictSchema),
  proofs: z.array(proofSchema),
});
export type EvidenceList = z.infer<typeof evidenceListResponseSchema>;

/** An approver's proof decision: what they read (content hash, evidence ids) is signed; unproven needs a reason. */
export const proofRequestSchema = z
  .strictObject({
    verdict: z.enum(PROOF_STATES),
    reason: z.string().trim().max(4000).default(""),
    contentHash: contentHashSchema,
    evidenceIds: z.array(dbIdSchema).max(500),
  })
  .refine((p) => p.verdict === "proven" || p.reason.length > 0, {
    path: ["reason"],
    message: "say why the revision is not proven",
  });
export type ProofRequest = z.input<typeof proofRequestSchema>;
export const proofResponseSchema = z.object({
  revision: z.number(),
  proof: z.enum(PROOF_STATES),
  decision: proofSchema,
});
