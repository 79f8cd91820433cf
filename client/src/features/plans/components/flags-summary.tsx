import type { StageResult } from "@shared/schemas/plans";
import { formatCount, sig3 } from "@/lib/format";
import { methodShort } from "../lib/method-table";
import { formatPairRanges } from "../lib/pair-ranges";
import { FramedTable } from "@/components/framed-table";

type FlagKey = keyof StageResult["flags"];

/** Our words for the engine's three per-pair flags (definitions in the shared analysis contract). */
export const FLAG_INFO: Record<FlagKey, { label: string; meaning: string }> = {
  unseenAngles: {
    label: "Unseen angles",
    meaning: "at the target length the pair turns further than it ever did in training",
  },
  compressedResolution: {
    label: "Compressed fine steps",
    meaning: "a fast pair slowed down, so neighbouring positions blur together",
  },
  exceedsTrainedWindow: {
    label: "Longer than the trained window",
    meaning: "the pair never completed one turn in training",
  },
};
const FLAGS = Object.keys(FLAG_INFO) as FlagKey[];

type Row = { scope: string; result: StageResult };

function FlagCell({ pairs }: { pairs: number[] }) {
  if (pairs.length === 0) return <span className="text-ink-soft">none</span>;
  return (
    <span className="flex flex-col">
      <span className="font-semibold text-signal-dark">{pairs.length} pairs</span>
      <span className="text-note text-ink-soft">{formatPairRanges(pairs)}</span>
    </span>
  );
}

/** Per stage and for the plan target: which pairs the engine flagged, as counts and index runs. */
export function FlagsSummary({ rows, pairs }: { rows: Row[]; pairs: number }) {
  return (
    <div className="flex flex-col gap-2">
      <FramedTable
        caption="Pair flags per stage"
        head={
          <>
            <th scope="col">Where</th>
            <th scope="col">Target (tokens)</th>
            <th scope="col">Method</th>
            <th scope="col">Attention factor</th>
            {FLAGS.map((f) => (
              <th key={f} scope="col">
                {FLAG_INFO[f].label}
              </th>
            ))}
          </>
        }
      >
        {rows.map(({ scope, result }) => (
          <tr key={scope} className="border-t border-rule/70 align-top">
            <th scope="row" className="px-3 py-2 font-medium">
              {scope}
            </th>
            <td className="px-3 py-2">{formatCount(result.targetContext)}</td>
            <td className="px-3 py-2">{methodShort(result.method)}</td>
            <td className="px-3 py-2">×{sig3(result.attentionFactor)}</td>
            {FLAGS.map((f) => (
              <td key={f} className="px-3 py-2" data-flag={f}>
                <FlagCell pairs={result.flags[f]} />
              </td>
            ))}
          </tr>
        ))}
      </FramedTable>
      <ul className="text-note text-ink-soft">
        {FLAGS.map((f) => (
          <li key={f}>
            <span className="font-semibold">{FLAG_INFO[f].label}</span>: {FLAG_INFO[f].meaning}. Pairs are numbered 0 to{" "}
            {pairs - 1}, fastest first.
          </li>
        ))}
      </ul>
    </div>
  );
}
