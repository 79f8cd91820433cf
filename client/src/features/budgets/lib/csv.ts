import Papa from "papaparse";
import type { BudgetEstimateResult } from "@shared/schemas/budget";

/**
 * The stage table with its figures, one row per stage and a totals row, in base units (bytes, FLOPs, hours).
 * Every row repeats the conventions used, so a pasted row still says what it assumed.
 */
export function stagesCsv(estimate: BudgetEstimateResult, clusterLabel: string): string {
  const a = estimate.assumptions;
  const conventions = {
    "FLOP convention": `${a.convention}: ${a.conventionFormula} (${a.conventionSource})`,
    "model FLOPs utilisation": `${a.utilization} (${a.utilizationBasis}: ${a.utilizationSource})`,
    "activation checkpointing": a.activationCheckpointing,
    "flash attention": a.flashAttention ? "on" : "off",
    "context parallelism": a.contextParallel,
    "loss chunks": a.lossChunks,
    "vocabulary size": a.vocabSize ?? "not given",
    "optimizer bytes per parameter": a.optimizerBytesPerParameter,
    "bytes per element": a.bytesPerElement,
    "KV cache bytes per element": a.kvCacheBytesPerElement,
    currency: estimate.currency,
    "budget model": estimate.budgetModel,
    cluster: clusterLabel,
  };
  const rows = estimate.stages.map((s) => ({
    stage: s.index + 1,
    "sequence length": s.sequenceLength,
    "global batch (sequences)": s.globalBatch,
    steps: s.steps,
    "token target": s.tokenTarget ?? "",
    tokens: s.tokens,
    "cumulative tokens": s.cumulativeTokens,
    "FLOPs per token": s.flopsPerToken,
    FLOPs: s.flops,
    "accelerator-hours": s.acceleratorHours,
    "wall-clock hours": s.wallClockHours,
    cost: s.cost,
    "training memory per accelerator (bytes)": s.trainingMemoryPerAccelerator,
    "model states (bytes)": s.trainingMemory.modelStates,
    "activation checkpoints (bytes)": s.trainingMemory.activationCheckpoints,
    "recompute workspace (bytes)": s.trainingMemory.recomputeWorkspace,
    "logits (bytes)": s.trainingMemory.logits,
    fits: s.fits ? "yes" : "no",
    "cheapest change that fits": s.fitChange
      ? `${s.fitChange.activationCheckpointing} checkpointing, context parallelism ${s.fitChange.contextParallel}, loss chunks ${s.fitChange.lossChunks}`
      : s.fits
        ? ""
        : "none",
    "KV cache per token (bytes)": s.kvCacheBytesPerToken,
    "KV cache per sequence (bytes)": s.kvCacheBytesPerSequence,
    "serving sequences per accelerator": s.servingSequencesPerAccelerator,
    warnings: s.warnings.join("; "),
    ...conventions,
  }));
  const t = estimate.totals;
  const totals = {
    stage: "total",
    tokens: t.tokens,
    FLOPs: t.flops,
    "accelerator-hours": t.acceleratorHours,
    "wall-clock hours": t.wallClockHours,
    cost: t.cost,
    ...conventions,
  };
  return Papa.unparse([...rows, totals], { columns: Object.keys(rows[0] ?? totals) });
}
