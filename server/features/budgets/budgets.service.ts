import { BUDGET_RECIPES, estimateBudget, RECIPE_CAUTION } from "../../engine/budget";
import type { Executor } from "../../db/client";
import { Invalid } from "../../platform/errors";
import { findModelRow, type ModelRow } from "../models";
import { findAccelerator } from "../accelerators";
import { workspaceCurrency } from "./currency.service";
import { MIN_UTILIZATION, type ModelExtras, type ParsedBudgetEstimateRequest } from "../../../shared/schemas/budget";
import { budgetShapeOf } from "../../../shared/profile-shapes";

/**
 * The vocabulary size of a stored profile, read from the config it was imported from: `vocab_size` at the top,
 * or in `text_config` for configs that nest the language model's settings (as transformers' composite
 * configs do). Undefined for hand-entered profiles or configs without it.
 */
export function profileVocabSize(row: Pick<ModelRow, "sourceConfig">): number | undefined {
  if (!row.sourceConfig) return undefined;
  try {
    const config = JSON.parse(row.sourceConfig) as { vocab_size?: unknown; text_config?: { vocab_size?: unknown } };
    const v = config.vocab_size ?? config.text_config?.vocab_size;
    return typeof v === "number" && Number.isInteger(v) && v > 0 ? v : undefined;
  } catch {
    return undefined;
  }
}

const extrasOf = (m: ModelExtras) =>
  Object.fromEntries(
    Object.entries({ vocabSize: m.vocabSize, layerGroups: m.layerGroups, kvLatentDim: m.kvLatentDim }).filter(
      ([, v]) => v !== undefined && v !== null,
    ),
  ) as ModelExtras;

/**
 * What a stored profile adds to the budget shape: its vocabulary (from its config), its layer groups (kind, layers,
 * window; the rotary fields are not the budget's) and its latent-attention cache width.
 */
export function profileExtras(
  row: Pick<ModelRow, "sourceConfig" | "layerGroups" | "kvLatentDim" | "layers">,
): ModelExtras {
  const groups = Array.isArray(row.layerGroups)
    ? (row.layerGroups as { kind: string; layers: number[]; slidingWindow: number | null }[]).map((g) => ({
        kind: g.kind,
        layers: g.layers,
        slidingWindow: g.slidingWindow,
      }))
    : undefined;
  const covers = groups && groups.reduce((n, g) => n + g.layers.length, 0) === row.layers;
  return extrasOf({
    vocabSize: profileVocabSize(row),
    layerGroups: covers ? groups : undefined,
    kvLatentDim: row.kvLatentDim ?? undefined,
  });
}

/** Replaces { modelId } and { acceleratorId } with the stored numbers, then runs the budget engine. */
export async function resolveAndEstimate(ex: Executor, req: ParsedBudgetEstimateRequest) {
  let model;
  if ("modelId" in req.model && req.model.modelId !== undefined) {
    const m = await findModelRow(ex, req.model.modelId);
    if (!m) throw new Invalid("no such model profile", { "model.modelId": "not found" });
    // What the request adds wins over what the profile says.
    model = { ...budgetShapeOf(m), ...profileExtras(m), ...extrasOf(req.model) };
  } else model = req.model as Exclude<typeof req.model, { modelId: number }>;
  let cluster;
  let acceleratorName: string | null = null;
  if ("acceleratorId" in req.cluster && req.cluster.acceleratorId !== undefined) {
    const a = await findAccelerator(ex, req.cluster.acceleratorId);
    if (!a) throw new Invalid("no such accelerator", { "cluster.acceleratorId": "not found" });
    cluster = { peakFlops: a.peakFlops, memoryBytes: a.memoryBytes, pricePerHour: a.pricePerHour };
    acceleratorName = a.name;
  } else cluster = req.cluster as Exclude<typeof req.cluster, { acceleratorId: number }>;
  const estimate = estimateBudget({ ...req, model, cluster });
  const u = estimate.assumptions.utilization;
  if (req.measuredTokensPerSecond !== undefined && (u > 1 || u < MIN_UTILIZATION)) {
    // The same bounds as a given utilisation: above the peak is impossible; below 0.1 % would make hours unbounded.
    const share = `${(u * 100).toPrecision(3)}% of the accelerator's peak FLOP/s`;
    throw new Invalid(
      `${req.measuredTokensPerSecond} tokens/s per accelerator means ${share}; check the throughput, the length it was measured at and the peak`,
      {
        measuredTokensPerSecond: u > 1 ? "implies more than the peak FLOP/s" : "implies under 0.1% of the peak FLOP/s",
      },
    );
  }
  const currency = await workspaceCurrency(ex);
  return { ...estimate, currency, resolved: { model, cluster, acceleratorName } };
}

/** The published starting points with the caution that goes with them. */
export const listRecipes = () => ({ recipes: [...BUDGET_RECIPES], caution: RECIPE_CAUTION });
