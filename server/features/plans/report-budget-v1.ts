import type { RevisionBudgetV1 } from "../../../shared/schemas/budget-v1";
import { esc, gib, sci } from "./report-format";

/**
 * The budget section of a revision frozen under budget model 1, printed as it was signed (its own figures and
 * wording; never recomputed). Kept unchanged beside report-budget.ts.
 */
export function budgetSectionV1(b: RevisionBudgetV1) {
  if ("skipped" in b) return `<h2>Budget</h2><p>${esc(b.skipped)}.</p>`;
  const e = b.estimate;
  const rows = e.stages
    .map(
      (
        s,
        i,
      ) => `<tr><td>${i + 1}</td><td>${sci(s.tokens)}</td><td>${sci(s.flopsPerToken)}</td><td>${sci(s.acceleratorHours)}</td>
<td>${sci(s.wallClockHours)}</td><td>${sci(s.cost)}</td><td>${gib(s.kvCacheBytesPerSequence)}</td><td>${gib(s.trainingMemoryPerAccelerator)}</td>
<td>${s.fits ? "fits" : `<span class="bad">does not fit${s.minSequenceSharding ? `; shard sequences ×${s.minSequenceSharding}` : ""}</span>`}</td></tr>`,
    )
    .join("");
  const a = e.assumptions;
  return `<h2>Budget</h2>
<p>Cluster: ${b.inputs.accelerators} × ${esc(b.cluster.name ?? "custom accelerator")} (peak ${sci(b.cluster.peakFlops)} FLOP/s, ${gib(b.cluster.memoryBytes)}, ${b.cluster.pricePerHour} per hour, copied from the catalog at submission).</p>
<table><tr><th>stage</th><th>tokens</th><th>FLOPs/token</th><th>accelerator-h</th><th>wall-clock h</th><th>cost</th><th>KV cache / sequence</th><th>training memory / accelerator</th><th>memory</th></tr>${rows}
<tr><th>total</th><td>${sci(e.totals.tokens)}</td><td></td><td>${sci(e.totals.acceleratorHours)}</td><td>${sci(e.totals.wallClockHours)}</td><td>${sci(e.totals.cost)}</td><td colspan="3"></td></tr></table>
<p>Assumptions: ${esc(a.convention)} convention (${esc(a.conventionFormula)}; ${esc(a.conventionSource)}), utilisation ${a.utilization} (${esc(a.utilizationSource)}),
recomputation ${a.recomputeFraction}, ${a.optimizerBytesPerParameter} bytes per parameter for weights, gradients and optimizer states (${esc(a.optimizerBytesSource)}),
${a.bytesPerElement} bytes per element. ${a.memoryModel.map(esc).join(" ")}</p>`;
}
