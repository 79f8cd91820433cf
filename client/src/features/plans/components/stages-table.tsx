import type { Stage } from "../../../../../shared/schemas/plans";
import { formatCount, formatScientific } from "../../../lib/format";
import { describeParams, methodShort } from "../lib/method-table";

/** Tokens trained in one stage: steps × global batch (sequences) × sequence length (DOMAIN notes, Budget). */
export const stageTokens = (s: Pick<Stage, "steps" | "globalBatch" | "sequenceLength">) => s.steps * s.globalBatch * s.sequenceLength;

export function StagesTable({ stages }: { stages: Stage[] }) {
  if (stages.length === 0) return <p className="text-body text-ink-soft">No stages: the plan goes to its target in one step.</p>;
  return (
    <div className="flex flex-col gap-1">
      <div className="overflow-x-auto rounded-md border border-rule">
        <table className="w-full border-collapse text-left text-body">
          <caption className="sr-only">Stages</caption>
          <thead className="bg-paper-deep text-note font-semibold tracking-wide text-ink-soft uppercase">
            <tr>
              <th scope="col" className="px-3 py-2">Stage</th>
              <th scope="col" className="px-3 py-2">Target (tokens)</th>
              <th scope="col" className="px-3 py-2">Method</th>
              <th scope="col" className="px-3 py-2">Steps</th>
              <th scope="col" className="px-3 py-2">Global batch (sequences)</th>
              <th scope="col" className="px-3 py-2">Sequence length (tokens)</th>
              <th scope="col" className="px-3 py-2">Learning rate</th>
              <th scope="col" className="px-3 py-2">Tokens trained</th>
              <th scope="col" className="px-3 py-2">Data mix</th>
            </tr>
          </thead>
          <tbody>
            {stages.map((s, i) => (
              <tr key={i} className="border-t border-rule/70 align-top">
                <th scope="row" className="px-3 py-2 font-medium">{i + 1}</th>
                <td className="px-3 py-2">{formatCount(s.targetContext)}</td>
                <td className="px-3 py-2">
                  {methodShort(s.method.method)}
                  <span className="block text-note text-ink-soft">{describeParams(s.method)}</span>
                </td>
                <td className="px-3 py-2">{formatCount(s.steps)}</td>
                <td className="px-3 py-2">{formatCount(s.globalBatch)}</td>
                <td className="px-3 py-2">{formatCount(s.sequenceLength)}</td>
                <td className="px-3 py-2">{formatScientific(s.learningRate)}</td>
                <td className="px-3 py-2">{formatCount(stageTokens(s))}</td>
                <td className="px-3 py-2 text-note">{s.dataMix || "—"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="text-note text-ink-soft">Tokens trained = steps × global batch × sequence length.</p>
    </div>
  );
}
