import type { z } from "zod";
import {
  budgetEstimateRequestSchema,
  type BudgetEstimateRequest,
  type BUDGET_RECIPE_IDS,
  type ActivationCheckpointing,
  type FLOP_CONVENTIONS,
  type ModelRequest,
} from "@shared/schemas/budget";
import { GIB, TFLOPS } from "@/lib/format";
import { plainSentence } from "@shared/validation-messages";
import { parseNumberText } from "@/lib/number-text";

export type RecipeId = (typeof BUDGET_RECIPE_IDS)[number];
export type Convention = (typeof FLOP_CONVENTIONS)[number];

/*
 * What the sheet's inputs hold: the text as typed, so "1e9" or a half-typed "3." survives a re-render.
 * An empty setting means "use the server's default", which the sheet states beside the input.
 */
export type StageDraft = {
  sequenceLength: string;
  globalBatch: string;
  by: "steps" | "tokens";
  steps: string;
  tokens: string;
  /** Set when the row was prefilled from a published recipe and not edited since. */
  recipeId?: RecipeId;
};

export type ClusterDraft = {
  kind: "catalog" | "custom";
  acceleratorId: string;
  /** Custom figures in the units people quote: TFLOP/s, GiB, price per accelerator-hour. */
  peakTflops: string;
  memoryGib: string;
  pricePerHour: string;
};

export type SettingsDraft = {
  accelerators: string;
  utilization: string;
  convention: Convention | "";
  activationCheckpointing: ActivationCheckpointing | "";
  /** "" = the server's default (on). */
  flashAttention: "" | "on" | "off";
  contextParallel: string;
  lossChunks: string;
  kvCacheBytesPerElement: string;
  measuredTokensPerSecond: string;
  measuredSequenceLength: string;
  /** The model's vocabulary when the profile does not carry one (the logits need it). */
  vocabSize: string;
  optimizerBytesPerParameter: string;
  microBatchSequences: string;
};

export type SheetDraft = { cluster: ClusterDraft; settings: SettingsDraft; stages: StageDraft[] };

export const emptyStage = (over: Partial<StageDraft> = {}): StageDraft => ({
  sequenceLength: "",
  globalBatch: "",
  by: "steps",
  steps: "",
  tokens: "",
  ...over,
});

/** Example custom figures, labelled as such on screen, so a first visit shows numbers. */
export const EXAMPLE_CLUSTER: ClusterDraft = {
  kind: "custom",
  acceleratorId: "",
  peakTflops: "400",
  memoryGib: "80",
  pricePerHour: "2.5",
};

export const defaultSettings = (): SettingsDraft => ({
  accelerators: "8",
  utilization: "",
  convention: "",
  activationCheckpointing: "",
  flashAttention: "",
  contextParallel: "",
  lossChunks: "",
  kvCacheBytesPerElement: "",
  measuredTokensPerSecond: "",
  measuredSequenceLength: "",
  vocabSize: "",
  optimizerBytesPerParameter: "",
  microBatchSequences: "",
});

function clusterRequest(c: ClusterDraft): BudgetEstimateRequest["cluster"] {
  if (c.kind === "catalog") return { acceleratorId: parseNumberText(c.acceleratorId) as number };
  const scaled = (text: string, unit: number) => {
    const v = parseNumberText(text);
    return v === undefined ? undefined : Math.round(v * unit);
  };
  return {
    peakFlops: scaled(c.peakTflops, TFLOPS),
    memoryBytes: scaled(c.memoryGib, GIB),
    pricePerHour: parseNumberText(c.pricePerHour),
  } as BudgetEstimateRequest["cluster"];
}

/** Cluster and settings as the plan's budget block and the estimate request both carry them. */
export function settingsRequest(draft: Pick<SheetDraft, "cluster" | "settings">) {
  const s = draft.settings;
  return {
    cluster: clusterRequest(draft.cluster),
    accelerators: parseNumberText(s.accelerators) as number,
    utilization: parseNumberText(s.utilization),
    convention: s.convention || undefined,
    activationCheckpointing: s.activationCheckpointing || undefined,
    flashAttention: s.flashAttention === "" ? undefined : s.flashAttention === "on",
    contextParallel: parseNumberText(s.contextParallel),
    lossChunks: parseNumberText(s.lossChunks),
    kvCacheBytesPerElement: parseNumberText(s.kvCacheBytesPerElement),
    measuredTokensPerSecond: parseNumberText(s.measuredTokensPerSecond),
    measuredSequenceLength: parseNumberText(s.measuredSequenceLength),
    vocabSize: parseNumberText(s.vocabSize),
    optimizerBytesPerParameter: parseNumberText(s.optimizerBytesPerParameter),
    microBatchSequences: parseNumberText(s.microBatchSequences),
  };
}

function stageRequest(s: StageDraft): BudgetEstimateRequest["stages"][number] {
  const common = {
    sequenceLength: parseNumberText(s.sequenceLength) as number,
    globalBatch: parseNumberText(s.globalBatch) as number,
  };
  return s.by === "steps"
    ? { ...common, steps: parseNumberText(s.steps) as number }
    : { ...common, tokens: parseNumberText(s.tokens) as number };
}

/** Drops keys whose value is undefined, so JSON and the query key stay small and stable. */
function compact<T extends object>(value: T): T {
  return Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as T;
}

export type SheetContext = { model: ModelRequest; trainedContext?: number; targetContext?: number };

export type BuiltRequest = { request: BudgetEstimateRequest | null; issues: Record<string, string> };

/**
 * The estimate request for a draft, checked against the shared contract before it is sent:
 * `issues` are keyed by the request path ("stages.1.globalBatch", "cluster.peakFlops") for the inputs to show.
 */
export function buildRequest(draft: SheetDraft, context: SheetContext): BuiltRequest {
  // The estimate request carries the vocabulary on the model; a plan's sheet stores it beside the settings.
  const { cluster, vocabSize, ...settings } = settingsRequest(draft);
  const candidate = compact({
    model: vocabSize === undefined ? context.model : ({ ...context.model, vocabSize } as ModelRequest),
    cluster: compact(cluster as Record<string, unknown>) as BudgetEstimateRequest["cluster"],
    ...compact(settings),
    trainedContext: context.trainedContext,
    targetContext: context.targetContext,
    stages: draft.stages.map(stageRequest),
  });
  const parsed = budgetEstimateRequestSchema.safeParse(candidate);
  if (parsed.success) return { request: candidate as BudgetEstimateRequest, issues: {} };
  return { request: null, issues: issuesByPath(parsed.error) };
}

export function issuesByPath(error: z.ZodError): Record<string, string> {
  const issues: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.join(".") === "model.vocabSize" ? "vocabSize" : issue.path.join(".");
    issues[key] ??= plainSentence(issue.path, issue.message);
  }
  return issues;
}
