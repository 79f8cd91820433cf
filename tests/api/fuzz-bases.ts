/**
 * A valid request body for each documented route that takes one, so that the fuzz test's single hostile
 * field is the only thing wrong and the request reaches storage and the engine.
 * `@@U@@` in a string becomes a fresh token on every send (names and e-mails that must be unique);
 * the number 987654321 stands for the draft's current version.
 */
import { decisionRequestSchema } from "../../shared/schemas";
import { sampleProfile } from "../fixtures/profiles";
import { twoStageRevision } from "../setup/plans";
import { probeDocument } from "../setup/probe";

export const VERSION_MARK = 987654321;

export interface FuzzIds {
  user: number;
  model: number;
  accelerator: number;
  token: number;
  draftPlan: number;
  reviewPlan: number;
  reviewHash: string;
}

const cluster = { peakFlops: 1e15, memoryBytes: 80e9, pricePerHour: 2 };
const settings = {
  accelerators: 64,
  utilization: 0.4,
  convention: "causal",
  activationCheckpointing: "full",
  flashAttention: true,
  contextParallel: 1,
  lossChunks: 1,
  kvCacheBytesPerElement: 2,
  measuredTokensPerSecond: 1000,
  measuredSequenceLength: 4096,
  optimizerBytesPerParameter: 12,
  microBatchSequences: 1,
};
const budget = { cluster, ...settings };
const profile = () =>
  sampleProfile({
    name: "Fuzz-@@U@@",
    maxPositionEmbeddings: 8192,
    parametersTotal: 7e9,
    currentScaling: {
      method: "yarn",
      params: { factor: 2 },
      raw: { rope_type: "yarn", factor: 2, original_max_position_embeddings: 4096 },
    },
  });
const accelerator = () => ({ name: "Skiff-@@U@@", memoryBytes: 80e9, peakFlops: 1e15, pricePerHour: 2, notes: "fuzz" });
/** One stage is enough: the second of the fixture has the same fields. */
const revision = () => ({
  ...twoStageRevision(),
  stages: twoStageRevision().stages.slice(1),
  bands: { alpha: 1, beta: 32 },
  budget,
});

/** Key: "<method> <documented path>". Several bases per route reach both sides of an either-or input. */
export function fuzzBases(ids: FuzzIds): Record<string, object[]> {
  const hasHash = "contentHash" in decisionRequestSchema.shape;
  const inlineModel = {
    headDim: 128,
    ropeTheta: 10_000,
    trainedContext: 4096,
    partialRotaryFactor: 1,
    layers: 32,
    attentionHeads: 32,
    kvHeads: 8,
    hiddenSize: 4096,
  };
  const methods = [
    { method: "yarn", factor: 8, betaFast: 32, betaSlow: 1, truncate: true, mscale: 1, mscaleAllDim: 0 },
    { method: "llama3", factor: 8, lowFreqFactor: 1, highFreqFactor: 4 },
    { method: "base", base: 500_000 },
  ];
  const budgetModel = {
    parameters: 7e9,
    layers: 32,
    attentionHeads: 32,
    kvHeads: 8,
    headDim: 128,
    hiddenSize: 4096,
    bytesPerElement: 2,
  };
  const stages = [
    { sequenceLength: 16384, globalBatch: 64, steps: 200 },
    { sequenceLength: 32768, globalBatch: 32, tokens: 1e9 },
  ];
  return {
    "post /api/auth/login": [{ email: "nobody@example.test", password: "wrong-password" }],
    "post /api/auth/password": [{ currentPassword: "wrong-password-000", newPassword: "fresh-password-456" }],
    "post /api/users": [
      { email: "f-@@U@@@example.test", name: "Fuzz", password: "fuzz-password-123", roles: ["viewer"] },
    ],
    "patch /api/users/{id}": [{ name: "Renamed", roles: ["viewer"], active: true }],
    "post /api/models": [profile()],
    "put /api/models/{id}": [profile()],
    "post /api/analyses": [
      { model: inlineModel, targetContext: 32768, bands: { alpha: 1, beta: 32 }, methods },
      { model: { modelId: ids.model }, targetContext: 32768, methods: [{ method: "yarn" }] },
    ],
    "post /api/exports": [
      { model: inlineModel, targetContext: 32768, method: { method: "yarn" }, targets: ["transformers-v4"] },
      { model: { modelId: ids.model }, targetContext: 32768, method: { method: "linear" } },
    ],
    "post /api/bounds/base": [{ rotaryDim: 128, targetContext: 8192, grid: { from: 1e3, to: 1e5, perDecade: 10 } }],
    "post /api/bounds/base/stream": [{ rotaryDim: 128, base: 10_000, maxLength: 8192 }],
    "post /api/plans": [
      { title: "Fuzz @@U@@", purpose: "fuzz", modelId: ids.model, requiredApprovals: 1, revision: revision() },
    ],
    "put /api/plans/settings": [{ minRequiredApprovals: 1 }],
    "put /api/budgets/currency": [{ currency: "USD" }],
    "put /api/plans/{id}/revisions/{n}": [
      { version: VERSION_MARK, notes: "fuzz", acceptance: twoStageRevision().acceptance, budget },
      { version: VERSION_MARK, budget: { cluster: { acceleratorId: ids.accelerator }, accelerators: 8 } },
    ],
    "post /api/plans/{id}/revisions/{n}/decisions": [
      { decision: "request_changes", comment: "fuzz", ...(hasHash ? { contentHash: ids.reviewHash } : {}) },
    ],
    "post /api/plans/{id}/revisions/{n}/conformance-checks": [probeDocument()],
    "post /api/plans/{id}/revisions/{n}/proof": [
      { verdict: "unproven", reason: "fuzz", contentHash: ids.reviewHash, evidenceIds: [] },
    ],
    "post /api/tokens": [{ name: "fuzz @@U@@" }],
    "post /api/budgets/estimate": [
      { model: budgetModel, cluster, ...settings, trainedContext: 4096, targetContext: 32768, growthPoints: 9, stages },
      { model: { modelId: ids.model }, cluster: { acceleratorId: ids.accelerator }, accelerators: 8, stages },
    ],
    "post /api/accelerators": [accelerator()],
    "put /api/accelerators/{id}": [accelerator()],
  };
}

/** Valid path parameters per documented path (the fuzz replaces one at a time). */
export function fuzzParams(path: string, ids: FuzzIds): Record<string, string> {
  const id = path.startsWith("/api/users")
    ? ids.user
    : path.startsWith("/api/models")
      ? ids.model
      : path.startsWith("/api/accelerators")
        ? ids.accelerator
        : path.startsWith("/api/tokens")
          ? ids.token
          : path.endsWith("/decisions")
            ? ids.reviewPlan
            : ids.draftPlan;
  return { id: String(id), n: "1", a: "1", b: "1", evidenceId: "1" };
}
