import type { GroupResult } from "@shared/schemas/plans";
import { LayerGroupsTable, type LayerGroupRow } from "@/components/layer-groups-table";
import { formatCount } from "@/lib/format";
import { methodShort } from "../lib/method-table";

const flagged = (g: GroupResult) => {
  const n = g.summary.unseenAnglesPairs + g.summary.compressedResolutionPairs;
  return n === 0 ? "no pair sees unseen angles or compressed resolution" : `${n} pairs flagged`;
};

/** A layered plan's frozen result per layer group: which layers the plan scales and which it keeps as trained. */
export function GroupResults({ groups }: { groups: GroupResult[] }) {
  const rows: LayerGroupRow[] = groups.map((g) => ({
    ...g,
    scaling: g.method === "none" ? "nothing: no position encoding" : methodShort(g.method),
    note:
      g.method === "none"
        ? "never scaled"
        : `${g.scaled ? "takes the plan's method" : g.method === "default" ? "kept as trained" : "its own method"}; checked up to ${formatCount(g.checkedUpTo)} tokens: ${flagged(g)}`,
  }));
  return (
    <div data-testid="group-results">
      <LayerGroupsTable rows={rows} caption="Layer groups in this revision" />
    </div>
  );
}
