import { isBudgetV2, type RevisionBudget, type RevisionBudgetV2 } from "@shared/schemas/budget";
import type { RevisionBudgetV1 } from "@shared/schemas/budget-v1";
import { Notice } from "@/components/notice";
import { formatBytes, formatCount, formatHours, formatMoney, formatScientific, sig3 } from "@/lib/format";
import { FramedTable } from "@/components/framed-table";
import { BudgetPanelV1 } from "./budget-panel-v1";

const cell = "px-3 py-2";
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
      <FramedTable
        caption="Budget per stage"
        head={
          <>
            <th scope="col">Stage</th>
            <th scope="col">{see("tokens", "Tokens")}</th>
            <th scope="col">{see("flops", "FLOPs")}</th>
            <th scope="col">{see("utilisation", "Accelerator-hours")}</th>
            <th scope="col">Wall clock</th>
            <th scope="col">{see("cost", `Cost (${currency})`)}</th>
            <th scope="col">{see("activations", "Memory per accelerator")}</th>
            <th scope="col">{see("fit", "Fits")}</th>
          </>
        }
        foot={
          <tr>
            <th scope="row" className={cell}>
              Total
            </th>
            <td className={cell}>{formatCount(estimate.totals.tokens)}</td>
            <td className={cell}>{formatScientific(estimate.totals.flops)}</td>
            <td className={cell}>{formatHours(estimate.totals.acceleratorHours)}</td>
            <td className={cell}>{formatHours(estimate.totals.wallClockHours)}</td>
            <td className={cell}>{money(estimate.totals.cost)}</td>
            <td className={cell} colSpan={2} />
          </tr>
        }
      >
        {estimate.stages.map((s) => (
          <tr key={s.index} className="border-t border-rule/70 align-top">
            <th scope="row" className={`${cell} font-medium`}>
              {s.index + 1}
            </th>
            <td className={cell}>{formatCount(s.tokens)}</td>
            <td className={cell}>{formatScientific(s.flops)}</td>
            <td className={cell}>{formatHours(s.acceleratorHours)}</td>
            <td className={cell}>{formatHours(s.wallClockHours)}</td>
            <td className={cell}>{money(s.cost)}</td>
            <td className={cell}>
              {formatBytes(s.trainingMemory.total)}
              <span className="block text-note text-ink-soft">
                states {formatBytes(s.trainingMemory.modelStates)}, checkpoints{" "}
                {formatBytes(s.trainingMemory.activationCheckpoints)}, workspace{" "}
                {formatBytes(s.trainingMemory.recomputeWorkspace)}, logits {formatBytes(s.trainingMemory.logits)}
              </span>
            </td>
            <td className={cell}>
              {s.fits ? (
                <span className="text-seaglass-dark">fits</span>
              ) : (
                <span className="font-semibold text-signal-dark">does not fit</span>
              )}
              {!s.fits && s.fitChange && (
                <span className="block text-note">
                  fits with {s.fitChange.activationCheckpointing} checkpointing, context parallelism{" "}
                  {s.fitChange.contextParallel}, loss chunks {s.fitChange.lossChunks}
                </span>
              )}
            </td>
          </tr>
        ))}
      </FramedTable>
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
