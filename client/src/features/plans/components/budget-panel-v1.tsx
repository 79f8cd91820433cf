import type { RevisionBudgetV1 } from "@shared/schemas/budget-v1";
import { Notice } from "@/components/notice";
import { formatBytes, formatCount, formatMoney, formatScientific, sig3 } from "@/lib/format";
import { FrozenStageTable } from "./frozen-stage-table";

// Model 1 froze no conventions to link to, so its heads are plain words.
const HEADS = {
  tokens: "Tokens",
  flops: "FLOPs",
  acceleratorHours: "Accelerator-hours",
  cost: "Cost",
  memory: "Memory per accelerator",
  fits: "Fits",
};

/**
 * A budget frozen under budget model 1, shown as it was signed: its own figures and wording, never recomputed.
 * Its schema (budget-v1) and wording stay its own beside budget-panel.tsx; only the stage table's frame is shared.
 */
export function BudgetPanelV1({ budget }: { budget: RevisionBudgetV1 }) {
  if ("skipped" in budget) return <p className="text-body text-ink-soft">No figures: {budget.skipped}.</p>;
  const { cluster, estimate, inputs } = budget;
  const a = estimate.assumptions;
  const allFit = estimate.stages.every((s) => s.fits);
  return (
    <div className="flex flex-col gap-3" data-testid="budget-panel">
      <p className="text-body">
        {formatCount(inputs.accelerators)} × {cluster.name ?? "custom accelerator"} (
        {formatScientific(cluster.peakFlops)} FLOP/s peak, {formatBytes(cluster.memoryBytes)},{" "}
        {formatMoney(cluster.pricePerHour)} per accelerator-hour), catalog figures as frozen in this revision.
      </p>
      {!allFit && (
        <Notice tone="alert" title="Does not fit">
          At least one stage needs more memory per accelerator than the cluster has; see the stage rows.
        </Notice>
      )}
      <FrozenStageTable
        stages={estimate.stages}
        totals={estimate.totals}
        heads={HEADS}
        money={(v) => formatMoney(v)}
        memory={(s) => formatBytes(s.trainingMemoryPerAccelerator)}
        fitHint={(s) =>
          s.minSequenceSharding !== null && (
            <span className="block text-note">needs sequence sharding ≥ {s.minSequenceSharding}</span>
          )
        }
      />
      <ul className="text-note text-ink-soft">
        <li>
          FLOPs per token: {a.conventionFormula} ({a.convention} attention; {a.conventionSource}).
        </li>
        <li>
          Utilisation {sig3(a.utilization * 100)}% of peak ({a.utilizationSource}); cost = accelerator-hours × price, in
          the catalog’s currency.
        </li>
        <li>
          Memory: {a.optimizerBytesPerParameter} optimizer bytes per parameter, {a.bytesPerElement} bytes per element,
          sequence sharding {a.sequenceSharding}.
        </li>
        {a.defaulted.length > 0 && <li>Defaults taken for: {a.defaulted.join(", ")}.</li>}
        <li>These are estimates: the run itself and long-context evaluations of the tuned model confirm a plan.</li>
      </ul>
    </div>
  );
}
