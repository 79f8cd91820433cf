import type { BudgetEstimateResponse } from "@shared/schemas/budget";
import { formatList } from "@/lib/format";

type Assumptions = BudgetEstimateResponse["assumptions"];

export const ESTIMATE_CAUTION =
  "These are estimates from a simple stated model, not measurements; the plan is confirmed only by long-context evaluations of the tuned model.";

/** One line under a figure: what it assumed. */
export function AssumptionLine({ assumptions, accelerators }: { assumptions: Assumptions; accelerators?: number }) {
  const a = assumptions;
  const defaulted = a.defaulted.filter((d) => !["growthPoints", "trainedContext", "targetContext"].includes(d));
  return (
    <p className="text-note text-ink-soft" data-testid="assumption-line">
      Assumes the {a.convention} FLOP convention ({a.conventionFormula}; {a.conventionSource}), model FLOPs utilisation{" "}
      {a.utilization}
      {a.defaulted.includes("utilization") ? " (assumed)" : ""}, {a.optimizerBytesPerParameter} optimizer bytes per
      parameter, {a.bytesPerElement} bytes per element, sequence sharding {a.sequenceSharding}
      {accelerators !== undefined ? `, ${accelerators} accelerators` : ""}
      {a.recomputeFraction > 0 ? `, recomputation of ${a.recomputeFraction} of the forward pass` : ""}.
      {defaulted.length > 0 && ` Defaulted: ${formatList(defaulted)}.`}
    </p>
  );
}

/** The full list: every figure the estimate rests on and where it comes from, and the caution. */
export function AssumptionsList({ assumptions }: { assumptions: Assumptions }) {
  const a = assumptions;
  return (
    <div className="flex flex-col gap-3 text-body" data-testid="assumptions">
      <p className="rounded-md border border-hemp/30 bg-hemp-pale/50 px-3 py-2 font-medium text-hemp-dark">
        {ESTIMATE_CAUTION}
      </p>
      <dl className="grid gap-x-6 gap-y-1 sm:grid-cols-[max-content_1fr]">
        <dt className="font-semibold">FLOP convention</dt>
        <dd>
          {a.convention}: <span className="font-mono text-note">{a.conventionFormula}</span> — {a.conventionSource}
        </dd>
        <dt className="font-semibold">Utilisation</dt>
        <dd>
          {a.utilization} — {a.utilizationSource}
        </dd>
        <dt className="font-semibold">Optimizer bytes per parameter</dt>
        <dd>
          {a.optimizerBytesPerParameter} — {a.optimizerBytesSource}
        </dd>
        <dt className="font-semibold">Recomputation</dt>
        <dd>{a.recomputeFraction} of the forward pass</dd>
        <dt className="font-semibold">Bytes per element</dt>
        <dd>{a.bytesPerElement}</dd>
        <dt className="font-semibold">Hidden size</dt>
        <dd>{a.hiddenSize}</dd>
        <dt className="font-semibold">Sharding</dt>
        <dd>
          sequence sharding {a.sequenceSharding}, {a.microBatchSequences} sequence
          {a.microBatchSequences === 1 ? "" : "s"} per micro-batch
        </dd>
        <dt className="font-semibold">Growth curve</dt>
        <dd>
          from {a.trainedContext} to 4 × {a.targetContext} tokens
        </dd>
        <dt className="font-semibold">Left at their default</dt>
        <dd>{a.defaulted.length ? formatList(a.defaulted) : "none"}</dd>
      </dl>
      <div>
        <p className="font-semibold">Memory model</p>
        <ul className="list-disc pl-5 text-note">
          {a.memoryModel.map((line) => (
            <li key={line}>{line}</li>
          ))}
        </ul>
      </div>
      <div>
        <p className="font-semibold">Notes</p>
        <ul className="list-disc pl-5 text-note">
          {a.notes.map((line) => (
            <li key={line}>{line}</li>
          ))}
        </ul>
      </div>
    </div>
  );
}
