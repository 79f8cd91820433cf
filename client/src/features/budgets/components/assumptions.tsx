import type { BudgetConventionId, BudgetEstimateResponse } from "@shared/schemas/budget";
import { formatList } from "@/lib/format";

type Assumptions = BudgetEstimateResponse["assumptions"];

export const ESTIMATE_CAUTION =
  "These are estimates from a stated model, not measurements; the plan is confirmed only by long-context evaluations of the tuned model.";

/** The anchor of a convention on the sheet: each figure links here instead of repeating it. */
export const conventionAnchor = (id: BudgetConventionId) => `budget-convention-${id}`;

/** Under a figure: which conventions it rests on, as links to where each is stated once. */
export function ConventionLinks({ assumptions, ids }: { assumptions: Assumptions; ids: BudgetConventionId[] }) {
  const byId = new Map(assumptions.conventions.map((c) => [c.id, c]));
  return (
    <p className="text-note text-ink-soft" data-testid="convention-links">
      Rests on:{" "}
      {ids.map((id, k) => (
        <span key={id}>
          {k > 0 && ", "}
          <a className="underline decoration-dotted" href={`#${conventionAnchor(id)}`}>
            {byId.get(id)?.title ?? id}
          </a>
        </span>
      ))}
      .
    </p>
  );
}

const onOff = (v: boolean) => (v ? "on" : "off");

/** The settings actually used (defaults marked), then every convention stated once, each with its anchor. */
export function AssumptionsList({ assumptions }: { assumptions: Assumptions }) {
  const a = assumptions;
  const rows: [string, string][] = [
    ["FLOP convention", `${a.convention}: ${a.conventionFormula} — ${a.conventionSource}`],
    ["Utilisation", `${a.utilization.toPrecision(3)} (${a.utilizationBasis}) — ${a.utilizationSource}`],
    ["Activation checkpointing", a.activationCheckpointing],
    ["Flash attention", onOff(a.flashAttention)],
    ["Context parallelism", `${a.contextParallel} (data-parallel ranks ${a.dataParallelRanks})`],
    ["Loss chunks", String(a.lossChunks)],
    ["Vocabulary", a.vocabSize === null ? "not given: logits not counted" : String(a.vocabSize)],
    ["Optimizer bytes per parameter", `${a.optimizerBytesPerParameter} — ${a.optimizerBytesSource}`],
    ["Bytes per element", `${a.bytesPerElement} (activations, weights); KV cache ${a.kvCacheBytesPerElement}`],
    ["Hidden size", String(a.hiddenSize)],
    ["Sequences per micro-batch", String(a.microBatchSequences)],
    ["Growth curve", `from ${a.trainedContext} to 4 × ${a.targetContext} tokens`],
    ["Left at their default", a.defaulted.length ? formatList(a.defaulted) : "none"],
  ];
  return (
    <div className="flex flex-col gap-3 text-body" data-testid="assumptions">
      <p className="rounded-md border border-hemp/30 bg-hemp-pale/50 px-3 py-2 font-medium text-hemp-dark">
        {ESTIMATE_CAUTION}
      </p>
      <dl className="grid gap-x-6 gap-y-1 sm:grid-cols-[max-content_1fr]">
        {rows.map(([k, v]) => (
          <div key={k} className="contents">
            <dt className="font-semibold">{k}</dt>
            <dd>{v}</dd>
          </div>
        ))}
      </dl>
      <div>
        <p className="font-semibold">Conventions</p>
        <ul className="flex flex-col gap-1 pl-5 text-note" data-testid="conventions">
          {a.conventions.map((c) => (
            <li key={c.id} id={conventionAnchor(c.id)} className="list-disc scroll-mt-20">
              <span className="font-semibold">{c.title}</span>{" "}
              <span className="text-ink-soft">
                ({c.basis}
                {c.source ? `: ${c.source}` : ""})
              </span>
              : {c.statement}
            </li>
          ))}
        </ul>
      </div>
    </div>
  );
}
