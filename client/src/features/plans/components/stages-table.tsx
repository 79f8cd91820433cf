import type { Stage } from "@shared/schemas/plans";
import { stageTokens } from "@shared/stage-tokens";
import { formatCount, formatScientific } from "@/lib/format";
import { describeParams, methodShort } from "../lib/method-table";
import { FramedTable } from "@/components/framed-table";

export function StagesTable({ stages }: { stages: Stage[] }) {
  if (stages.length === 0)
    return <p className="text-body text-ink-soft">No stages: the plan goes to its target in one step.</p>;
  return (
    <div className="flex flex-col gap-1">
      <FramedTable
        caption="Stages"
        head={
          <>
            <th scope="col">Stage</th>
            <th scope="col">Target (tokens)</th>
            <th scope="col">Method</th>
            <th scope="col">Steps</th>
            <th scope="col">Global batch (sequences)</th>
            <th scope="col">Sequence length (tokens)</th>
            <th scope="col">Learning rate</th>
            <th scope="col">Tokens trained</th>
            <th scope="col">Data mix</th>
          </>
        }
      >
        {stages.map((s, i) => (
          <tr key={i} className="border-t border-rule/70 align-top">
            <th scope="row" className="px-3 py-2 font-medium">
              {i + 1}
            </th>
            <td className="px-3 py-2">{formatCount(s.targetContext)}</td>
            <td className="px-3 py-2">
              {methodShort(s.method.method)}
              <span className="block text-note text-ink-soft">{describeParams(s.method)}</span>
            </td>
            <td className="px-3 py-2">{formatCount(s.steps)}</td>
            <td className="px-3 py-2">{formatCount(s.globalBatch)}</td>
            <td className="px-3 py-2">{formatCount(s.sequenceLength)}</td>
            <td className="px-3 py-2">{formatScientific(s.learningRate)}</td>
            <td className="px-3 py-2">{formatCount(stageTokens(s).tokens)}</td>
            <td className="px-3 py-2 text-note">{s.dataMix || "—"}</td>
          </tr>
        ))}
      </FramedTable>
      <p className="text-note text-ink-soft">Tokens trained = steps × global batch × sequence length.</p>
    </div>
  );
}
