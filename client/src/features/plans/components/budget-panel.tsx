import { isBudgetV2, type RevisionBudget, type RevisionBudgetV2 } from "@shared/schemas/budget";
import type { RevisionBudgetV1 } from "@shared/schemas/budget-v1";
import { Notice } from "@/components/notice";
import { formatBytes, formatCount, formatMoney, formatScientific, sig3 } from "@/lib/format";
import { BudgetPanelV1 } from "./budget-panel-v1";
import { FrozenStageTable } from "./frozen-stage-table";
const see = (id: string, label: string) => (
  <a className="underline decoration-dotted" href={`#frozen-convention-${id}`}>
    {label}
  </a>
);

/** The revision's frozen budget, in the budget model it was frozen with. */
export function BudgetPanel({ budget }: { budget: RevisionBudget }) {
  return isBudgetV2(budget) ? <BudgetPanelV2 budget={budget} /> : <BudgetPanelV1 budget={budget as RevisionBudgetV1} />;
}

/** Budget model 2: per-stage cost and memory by term, totals, and each convention stated once below. */
function BudgetPanelV2({ budget }: { budget: RevisionBudgetV2 }) {
  if ("skipped" in budget) return <p className="text-body text-ink-soft">No figures: {budget.skipped}.</p>;
  const { cluster, estimate, inputs, currency } = budget;
  const a = estimate.assumptions;
  const money = (v: number) => formatMoney(v, currency);
  const allFit = estimate.stages.every((s) => s.fits);
  return (
    <div className="flex flex-col gap-3" data-testid="budget-panel">
      <p className="text-body">
        {formatCount(inputs.accelerators)} × {cluster.name ?? "custom accelerator"} (
        {formatScientific(cluster.peakFlops)} FLOP/s peak, {formatBytes(cluster.memoryBytes)},{" "}
        {money(cluster.pricePerHour)} per accelerator-hour), catalog figures and currency as frozen in this revision.{" "}
        {a.activationCheckpointing} checkpointing, flash attention {a.flashAttention ? "on" : "off"}, context
        parallelism {a.contextParallel}, loss chunks {a.lossChunks}; utilisation {sig3(a.utilization * 100)}% (
        {a.utilizationBasis}).
      </p>
      {!allFit && (
        <Notice tone="alert" title="Does not fit">
          At least one stage needs more memory per accelerator than the cluster has; see the stage rows.
        </Notice>
      )}
      <FrozenStageTable
        stages={estimate.stages}
        totals={estimate.totals}
        heads={{
          tokens: see("tokens", "Tokens"),
          flops: see("flops", "FLOPs"),
          acceleratorHours: see("utilisation", "Accelerator-hours"),
          cost: see("cost", `Cost (${currency})`),
          memory: see("activations", "Memory per accelerator"),
          fits: see("fit", "Fits"),
        }}
        money={money}
        memory={({ trainingMemory: m }) => (
          <>
            {formatBytes(m.total)}
            <span className="block text-note text-ink-soft">
              states {formatBytes(m.modelStates)}, checkpoints {formatBytes(m.activationCheckpoints)}, workspace{" "}
              {formatBytes(m.recomputeWorkspace)}, logits {formatBytes(m.logits)}
            </span>
          </>
        )}
        fitHint={({ fitChange }) =>
          fitChange && (
            <span className="block text-note">
              fits with {fitChange.activationCheckpointing} checkpointing, context parallelism{" "}
              {fitChange.contextParallel}, loss chunks {fitChange.lossChunks}
            </span>
          )
        }
      />
      <ul className="flex flex-col gap-1 text-note text-ink-soft" data-testid="frozen-conventions">
        {a.conventions.map((c) => (
          <li key={c.id} id={`frozen-convention-${c.id}`}>
            <span className="font-semibold">{c.title}</span> ({c.basis}
            {c.source ? `: ${c.source}` : ""}): {c.statement}
          </li>
        ))}
        <li>These are estimates: the run itself and long-context evaluations of the tuned model confirm a plan.</li>
      </ul>
    </div>
  );
}
