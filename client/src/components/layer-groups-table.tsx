import { FramedTable } from "./framed-table";
import { formatCount } from "@/lib/format";

/** One row: a set of layers that share a rotary setting (a profile's layer group, or a plan's result for it). */
export type LayerGroupRow = {
  kind: string;
  layers: number[];
  ropeTheta: number | null;
  rotaryDim: number;
  slidingWindow: number | null;
  /** what the layers rotate with: the scaling as shipped, or the plan's method for them */
  scaling: string;
  /** a plain-words remark (e.g. "scaled by the plan", "kept as trained", counts of flagged pairs) */
  note?: string;
};

const KIND_WORDS: Record<string, string> = {
  full_attention: "Full attention",
  sliding_attention: "Local window",
  no_rope: "No position encoding",
};
const kindLabel = (k: string) => KIND_WORDS[k] ?? k.replace(/_/g, " ");

/** "0–4, 6–10": runs of consecutive layer indices. */
export function layerRuns(layers: readonly number[]): string {
  const runs: string[] = [];
  for (let i = 0; i < layers.length;) {
    let j = i;
    while (j + 1 < layers.length && layers[j + 1] === layers[j] + 1) j++;
    runs.push(j === i ? String(layers[i]) : `${layers[i]}–${layers[j]}`);
    i = j + 1;
  }
  return runs.join(", ");
}

/** The model's layer groups: which layers rotate how. A model without layer types shows one row. */
export function LayerGroupsTable({ rows, caption = "Layer groups" }: { rows: LayerGroupRow[]; caption?: string }) {
  return (
    <FramedTable
      caption={caption}
      head={
        <>
          <th scope="col">Layers</th>
          <th scope="col">Which</th>
          <th scope="col">Base θ</th>
          <th scope="col">Rotary d</th>
          <th scope="col">Window</th>
          <th scope="col">Rotates with</th>
        </>
      }
    >
      {rows.map((g) => (
        <tr key={g.kind} className="border-t border-rule/70 align-top" data-kind={g.kind}>
          <th scope="row" className="px-3 py-2 font-medium">
            {kindLabel(g.kind)}
            <span className="block text-note font-normal text-ink-soft">{g.layers.length} layers</span>
          </th>
          <td className="px-3 py-2 text-note">{layerRuns(g.layers)}</td>
          <td className="px-3 py-2">{g.ropeTheta === null ? "—" : formatCount(g.ropeTheta)}</td>
          <td className="px-3 py-2">{g.rotaryDim || "—"}</td>
          <td className="px-3 py-2">{g.slidingWindow === null ? "—" : formatCount(g.slidingWindow)}</td>
          <td className="px-3 py-2">
            {g.scaling}
            {g.note && <span className="block text-note text-ink-soft">{g.note}</span>}
          </td>
        </tr>
      ))}
    </FramedTable>
  );
}
