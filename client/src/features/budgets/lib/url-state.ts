import { emptyShape, SHAPE_FIELDS, type ModelDraft } from "./model-draft";
import {
  defaultSettings,
  EXAMPLE_CLUSTER,
  type ClusterDraft,
  type SettingsDraft,
  type SheetDraft,
  type StageDraft,
  type RecipeId,
} from "./sheet-draft";

/*
 * The estimator's inputs live in the URL so a figure can be shared by its link:
 *   model=<id> | shape=<parameters>_<layers>_<heads>_<kvHeads>_<headDim>[_<hidden>[_<bytes>]]
 *   acc=<id> | peak=<TFLOP/s>&mem=<GiB>&price=<per hour>
 *   n, util, conv, ckpt, fa, cp, lc, kvb, tps, tpl, vocab, opt, mb   (accelerators and settings; absent = default)
 *   (links made before budget model 2 may carry sp = context parallelism and rf = 0 | 1 = none | full)
 *   st=<length>_<batch>_<steps | t<tokens>>[_<recipe id>]   (one per stage, in order)
 */

const SETTING_KEYS: Record<
  Exclude<keyof SettingsDraft, "convention" | "activationCheckpointing" | "flashAttention">,
  string
> = {
  accelerators: "n",
  utilization: "util",
  contextParallel: "cp",
  lossChunks: "lc",
  kvCacheBytesPerElement: "kvb",
  measuredTokensPerSecond: "tps",
  measuredSequenceLength: "tpl",
  vocabSize: "vocab",
  optimizerBytesPerParameter: "opt",
  microBatchSequences: "mb",
};
const RECIPES: readonly RecipeId[] = ["position-interpolation", "yarn", "adjusted-base"];

export const DEFAULT_STAGES: StageDraft[] = [
  { sequenceLength: "16384", globalBatch: "64", by: "steps", steps: "200", tokens: "" },
  { sequenceLength: "32768", globalBatch: "32", by: "steps", steps: "200", tokens: "" },
];

function stageFromText(text: string): StageDraft {
  const [sequenceLength = "", globalBatch = "", amount = "", recipe] = text.split("_");
  const byTokens = amount.startsWith("t");
  const recipeId = RECIPES.find((r) => r === recipe);
  return {
    sequenceLength,
    globalBatch,
    by: byTokens ? "tokens" : "steps",
    steps: byTokens ? "" : amount,
    tokens: byTokens ? amount.slice(1) : "",
    ...(recipeId ? { recipeId } : {}),
  };
}

// "_" separates the fields, so it is dropped from the values (where it could only be a digit separator).
const stageToText = (s: StageDraft) =>
  [s.sequenceLength, s.globalBatch, s.by === "tokens" ? `t${s.tokens}` : s.steps, ...(s.recipeId ? [s.recipeId] : [])]
    .map((v) => v.replace(/_/g, ""))
    .join("_");

export function modelFromSearch(params: URLSearchParams): ModelDraft {
  const shape = params.get("shape");
  if (shape !== null) {
    const parts = shape.split("_");
    const draft = emptyShape();
    SHAPE_FIELDS.forEach((field, i) => (draft[field] = parts[i] ?? ""));
    return draft;
  }
  return { kind: "profile", modelId: params.get("model") ?? "" };
}

export function sheetFromSearch(params: URLSearchParams): SheetDraft {
  const acc = params.get("acc");
  const custom = ["peak", "mem", "price"].some((k) => params.has(k));
  const cluster: ClusterDraft =
    acc !== null
      ? { ...EXAMPLE_CLUSTER, kind: "catalog", acceleratorId: acc }
      : custom
        ? {
            kind: "custom",
            acceleratorId: "",
            peakTflops: params.get("peak") ?? "",
            memoryGib: params.get("mem") ?? "",
            pricePerHour: params.get("price") ?? "",
          }
        : EXAMPLE_CLUSTER;
  const settings = defaultSettings();
  for (const [field, key] of Object.entries(SETTING_KEYS) as [keyof typeof SETTING_KEYS, string][]) {
    const v = params.get(key);
    if (v !== null) settings[field] = v;
  }
  const conv = params.get("conv");
  if (conv === "causal" || conv === "full") settings.convention = conv;
  const ckpt = params.get("ckpt") ?? { "0": "none", "1": "full" }[params.get("rf") ?? ""];
  if (ckpt === "none" || ckpt === "selective" || ckpt === "full") settings.activationCheckpointing = ckpt;
  const fa = params.get("fa");
  if (fa === "on" || fa === "off") settings.flashAttention = fa;
  if (!params.has("cp") && params.has("sp")) settings.contextParallel = params.get("sp") ?? "";
  const stages = params.getAll("st").map(stageFromText);
  return { cluster, settings, stages: stages.length ? stages : DEFAULT_STAGES };
}

export function toSearch(model: ModelDraft, sheet: SheetDraft): URLSearchParams {
  const p = new URLSearchParams();
  if (model.kind === "profile") {
    if (model.modelId) p.set("model", model.modelId);
  } else {
    // Trailing optional fields are dropped, inner blanks kept so positions hold.
    p.set(
      "shape",
      SHAPE_FIELDS.map((f) => model[f])
        .join("_")
        .replace(/_+$/, ""),
    );
  }
  const c = sheet.cluster;
  if (c.kind === "catalog") p.set("acc", c.acceleratorId);
  else {
    p.set("peak", c.peakTflops);
    p.set("mem", c.memoryGib);
    p.set("price", c.pricePerHour);
  }
  for (const [field, key] of Object.entries(SETTING_KEYS) as [keyof typeof SETTING_KEYS, string][]) {
    if (sheet.settings[field] !== "") p.set(key, sheet.settings[field]);
  }
  if (sheet.settings.convention) p.set("conv", sheet.settings.convention);
  if (sheet.settings.activationCheckpointing) p.set("ckpt", sheet.settings.activationCheckpointing);
  if (sheet.settings.flashAttention) p.set("fa", sheet.settings.flashAttention);
  for (const s of sheet.stages) p.append("st", stageToText(s));
  return p;
}
