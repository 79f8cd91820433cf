import type { RevisionBudgetV1 } from "@shared/schemas/budget-v1";
import { Notice } from "@/components/notice";
import { formatBytes, formatCount, formatHours, formatMoney, formatScientific, sig3 } from "@/lib/format";
import { FramedTable } from "@/components/framed-table";

const cell = "px-3 py-2";

/**
 * A budget frozen under budget model 1, shown as it was signed: its own figures and wording, never recomputed.
 * Kept unchanged beside budget-panel.tsx.
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
      <FramedTable
        caption="Budget per stage"
        head={
          <>
            <th scope="col">Stage</th>
            <th scope="col">Tokens</th>
            <th scope="col">FLOPs</th>
            <th scope="col">Accelerator-hours</th>
            <th scope="col">Wall clock</th>
            <th scope="col">Cost</th>
            <th scope="col">Memory per accelerator</th>
            <th scope="col">Fits</th>
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
            <td className={cell}>{formatMoney(estimate.totals.cost)}</td>
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
            <td className={cell}>{formatMoney(s.cost)}</td>
            <td className={cell}>{formatBytes(s.trainingMemoryPerAccelerator)}</td>
            <td className={cell}>
              {s.fits ? (
                <span className="text-seaglass-dark">fits</span>
              ) : (
                <span className="font-semibold text-signal-dark">does not fit</span>
              )}
              {!s.fits && s.minSequenceSharding !== null && (
                <span className="block text-note">needs sequence sharding ≥ {s.minSequenceSharding}</span>
              )}
            </td>
          </tr>
        ))}
      </FramedTable>
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
