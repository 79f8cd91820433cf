import type { RevisionBudget } from "../../../../../shared/schemas/budget";
import { Notice } from "../../../components/notice";
import { formatBytes, formatCount, formatHours, formatMoney, formatScientific, sig3 } from "../../../lib/format";

const th = "px-3 py-2";

/** The revision's frozen budget: per-stage cost and memory, totals, and the assumptions beside them. */
export function BudgetPanel({ budget }: { budget: RevisionBudget }) {
  if ("skipped" in budget) return <p className="text-body text-ink-soft">No figures: {budget.skipped}.</p>;
  const { cluster, estimate, inputs } = budget;
  const a = estimate.assumptions;
  const allFit = estimate.stages.every((s) => s.fits);
  return (
    <div className="flex flex-col gap-3" data-testid="budget-panel">
      <p className="text-body">
        {formatCount(inputs.accelerators)} × {cluster.name ?? "custom accelerator"} ({formatScientific(cluster.peakFlops)} FLOP/s peak,{" "}
        {formatBytes(cluster.memoryBytes)}, {formatMoney(cluster.pricePerHour)} per accelerator-hour), catalog figures as frozen in this revision.
      </p>
      {!allFit && <Notice tone="alert" title="Does not fit">At least one stage needs more memory per accelerator than the cluster has; see the stage rows.</Notice>}
      <div className="overflow-x-auto rounded-md border border-rule">
        <table className="w-full border-collapse text-left text-body">
          <caption className="sr-only">Budget per stage</caption>
          <thead className="bg-paper-deep text-note font-semibold tracking-wide text-ink-soft uppercase">
            <tr>
              <th scope="col" className={th}>Stage</th>
              <th scope="col" className={th}>Tokens</th>
              <th scope="col" className={th}>FLOPs</th>
              <th scope="col" className={th}>Accelerator-hours</th>
              <th scope="col" className={th}>Wall clock</th>
              <th scope="col" className={th}>Cost</th>
              <th scope="col" className={th}>Memory per accelerator</th>
              <th scope="col" className={th}>Fits</th>
            </tr>
          </thead>
          <tbody>
            {estimate.stages.map((s) => (
              <tr key={s.index} className="border-t border-rule/70 align-top">
                <th scope="row" className={`${th} font-medium`}>{s.index + 1}</th>
                <td className={th}>{formatCount(s.tokens)}</td>
                <td className={th}>{formatScientific(s.flops)}</td>
                <td className={th}>{formatHours(s.acceleratorHours)}</td>
                <td className={th}>{formatHours(s.wallClockHours)}</td>
                <td className={th}>{formatMoney(s.cost)}</td>
                <td className={th}>{formatBytes(s.trainingMemoryPerAccelerator)}</td>
                <td className={th}>
                  {s.fits ? <span className="text-seaglass-dark">fits</span> : <span className="font-semibold text-signal-dark">does not fit</span>}
                  {!s.fits && s.minSequenceSharding !== null && <span className="block text-note">needs sequence sharding ≥ {s.minSequenceSharding}</span>}
                </td>
              </tr>
            ))}
          </tbody>
          <tfoot className="border-t-2 border-rule-strong font-semibold">
            <tr>
              <th scope="row" className={th}>Total</th>
              <td className={th}>{formatCount(estimate.totals.tokens)}</td>
              <td className={th}>{formatScientific(estimate.totals.flops)}</td>
              <td className={th}>{formatHours(estimate.totals.acceleratorHours)}</td>
              <td className={th}>{formatHours(estimate.totals.wallClockHours)}</td>
              <td className={th}>{formatMoney(estimate.totals.cost)}</td>
              <td className={th} colSpan={2} />
            </tr>
          </tfoot>
        </table>
      </div>
      <ul className="text-note text-ink-soft">
        <li>FLOPs per token: {a.conventionFormula} ({a.convention} attention; {a.conventionSource}).</li>
        <li>Utilisation {sig3(a.utilization * 100)}% of peak ({a.utilizationSource}); cost = accelerator-hours × price, in the catalog’s currency.</li>
        <li>Memory: {a.optimizerBytesPerParameter} optimizer bytes per parameter, {a.bytesPerElement} bytes per element, sequence sharding {a.sequenceSharding}.</li>
        {a.defaulted.length > 0 && <li>Defaults taken for: {a.defaulted.join(", ")}.</li>}
        <li>These are estimates: the run itself and long-context evaluations of the tuned model confirm a plan.</li>
      </ul>
    </div>
  );
}
