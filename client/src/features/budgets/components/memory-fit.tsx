import type { BudgetEstimateResult, MEMORY_TERMS } from "@shared/schemas/budget";
import { Notice } from "@/components/notice";
import { formatBytes, formatCount } from "@/lib/format";
import { FramedTable } from "@/components/framed-table";

type Stage = BudgetEstimateResult["stages"][number];
type Term = (typeof MEMORY_TERMS)[number];

export const TERM_LABELS: Record<Term, string> = {
  modelStates: "model states",
  activationCheckpoints: "activation checkpoints",
  recomputeWorkspace: "recompute workspace",
  logits: "logits",
};

/** The settings a fit change alters, in words. */
function changeWords(s: Stage, current: BudgetEstimateResult["assumptions"]): string {
  const c = s.fitChange;
  if (!c) return "";
  const parts: string[] = [];
  if (c.activationCheckpointing !== current.activationCheckpointing)
    parts.push(`${c.activationCheckpointing} checkpointing`);
  if (c.contextParallel !== current.contextParallel) parts.push(`context parallelism ${c.contextParallel}`);
  if (c.lossChunks !== current.lossChunks) parts.push(`loss chunks ${c.lossChunks}`);
  return parts.join(" and ");
}

/** Whether each stage's training state fits one accelerator, term by term, the cheapest change that does, and serving. */
export function MemoryFit({ estimate, memoryBytes }: { estimate: BudgetEstimateResult; memoryBytes: number }) {
  const { stages, assumptions: a, serving } = estimate;
  const misfits = stages.filter((s) => !s.fits);
  return (
    <div className="flex flex-col gap-3" data-testid="memory-fit">
      {misfits.map((s) => (
        <Notice key={s.index} tone="alert" title={`Stage ${s.index + 1} does not fit in accelerator memory`}>
          <p data-testid="fit-advice">
            Training needs {formatBytes(s.trainingMemory.total)} per accelerator; each has {formatBytes(memoryBytes)}.
            The largest term is the {TERM_LABELS[s.largestMemoryTerm]} (
            {formatBytes(s.trainingMemory[s.largestMemoryTerm])}).{" "}
            {s.fitChange
              ? `The cheapest change that fits: ${changeWords(s, a)} (${formatBytes(s.fitChange.total)}).`
              : "No stronger checkpointing, context parallelism or loss chunking within this cluster fits: use more accelerators, larger ones, or a shorter sequence."}
          </p>
        </Notice>
      ))}
      <FramedTable
        caption="Memory per stage"
        head={
          <>
            <th scope="col">Stage</th>
            <th scope="col">Training memory per accelerator</th>
            <th scope="col">Fits {formatBytes(memoryBytes)}?</th>
            <th scope="col">KV cache per token / per sequence</th>
            <th scope="col">Serving sequences per accelerator</th>
          </>
        }
      >
        {stages.map((s) => (
          <tr key={s.index} className="border-b border-rule/70 align-top last:border-b-0" data-testid="memory-row">
            <th scope="row" className="px-2 py-2 text-left font-medium">
              Stage {s.index + 1}{" "}
              <span className="font-normal text-ink-soft">({formatCount(s.sequenceLength)} tokens)</span>
            </th>
            <td className="px-2 py-2 tabular-nums">
              {formatBytes(s.trainingMemory.total)}
              <span className="block text-note text-ink-soft">
                {(Object.keys(TERM_LABELS) as Term[])
                  .map((t) => `${TERM_LABELS[t]} ${formatBytes(s.trainingMemory[t])}`)
                  .join(" + ")}
              </span>
            </td>
            <td
              className={`px-2 py-2 font-medium ${s.fits ? "text-seaglass-dark" : "text-signal"}`}
              data-testid="fit-cell"
            >
              {s.fits ? "fits" : "does not fit"}
            </td>
            <td className="px-2 py-2 tabular-nums">
              {formatBytes(s.kvCacheBytesPerToken)} / {formatBytes(s.kvCacheBytesPerSequence)}
            </td>
            <td className="px-2 py-2 tabular-nums">
              {formatCount(s.servingSequencesPerAccelerator)}
              {s.warnings
                .filter((w) => w.includes("serving"))
                .map((w) => (
                  <span key={w} className="block text-note text-signal">
                    {w}
                  </span>
                ))}
            </td>
          </tr>
        ))}
      </FramedTable>
      <p className="text-body" data-testid="longest-servable">
        One accelerator serves a single sequence of up to{" "}
        <span className="font-semibold tabular-nums">{formatCount(serving.longestServableContext)}</span> tokens beside{" "}
        {formatBytes(serving.weightBytes)} of weights, at {serving.kvCacheBytesPerElement} byte
        {serving.kvCacheBytesPerElement === 1 ? "" : "s"} per cached element.
      </p>
      {a.vocabSize === null && (
        <p className="text-note text-signal">
          The vocabulary size is not known, so the logits are not counted: give it under the memory model.
        </p>
      )}
    </div>
  );
}
