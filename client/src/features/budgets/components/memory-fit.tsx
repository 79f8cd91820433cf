import type { BudgetEstimateResponse } from "@shared/schemas/budget";
import { Notice } from "@/components/notice";
import { formatBytes, formatCount } from "@/lib/format";
import { FramedTable } from "@/components/framed-table";

type Stage = BudgetEstimateResponse["stages"][number];

/** Whether each stage's training state fits one accelerator, the smallest sequence sharding that does, and the serving view. */
export function MemoryFit({
  stages,
  memoryBytes,
  sequenceSharding,
}: {
  stages: Stage[];
  memoryBytes: number;
  sequenceSharding: number;
}) {
  const misfits = stages.filter((s) => !s.fits);
  return (
    <div className="flex flex-col gap-3" data-testid="memory-fit">
      {misfits.map((s) => (
        <Notice key={s.index} tone="alert" title={`Stage ${s.index + 1} does not fit in accelerator memory`}>
          <p>
            Training needs {formatBytes(s.trainingMemoryPerAccelerator)} per accelerator at sequence sharding{" "}
            {sequenceSharding}; each has {formatBytes(memoryBytes)}.{" "}
            {s.minSequenceSharding === null
              ? "No power-of-two sequence sharding within this cluster fits: use more accelerators, larger ones, or a shorter sequence."
              : `Sharding each sequence over ${s.minSequenceSharding} accelerators is the smallest degree that fits.`}
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
            <th scope="col">Smallest sequence sharding that fits</th>
            <th scope="col">KV cache per token / per sequence</th>
            <th scope="col">Serving sequences per accelerator</th>
          </>
        }
      >
        {stages.map((s) => (
          <tr key={s.index} className="border-b border-rule/70 align-top last:border-b-0">
            <th scope="row" className="px-2 py-2 text-left font-medium">
              Stage {s.index + 1}{" "}
              <span className="font-normal text-ink-soft">({formatCount(s.sequenceLength)} tokens)</span>
            </th>
            <td className="px-2 py-2 tabular-nums">
              {formatBytes(s.trainingMemory.total)}
              <span className="block text-note text-ink-soft">
                model states {formatBytes(s.trainingMemory.modelStates)} + activations{" "}
                {formatBytes(s.trainingMemory.activations)}
              </span>
            </td>
            <td className={`px-2 py-2 font-medium ${s.fits ? "text-seaglass-dark" : "text-signal"}`}>
              {s.fits ? "fits" : "does not fit"}
            </td>
            <td className="px-2 py-2">{s.minSequenceSharding ?? "none up to the cluster size"}</td>
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
    </div>
  );
}
