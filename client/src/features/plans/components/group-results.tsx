import type { GroupResult } from "@shared/schemas/plans";
import { LayerGroupsTable, layerRuns, type LayerGroupRow } from "@/components/layer-groups-table";
import { formatCount } from "@/lib/format";
import { methodShort } from "../lib/method-table";

const pairs = (idx: number[]) => `${idx.length} pair${idx.length === 1 ? "" : "s"} (${layerRuns(idx)})`;

/** The group's own per-pair flags (its base, rotary dimension and method), named pair by pair. */
export function groupFlagWords(g: Pick<GroupResult, "flags">): string {
  const { unseenAngles, compressedResolution, exceedsTrainedWindow } = g.flags;
  const parts: string[] = [];
  if (unseenAngles.length) parts.push(`unseen angles on ${pairs(unseenAngles)}`);
  if (compressedResolution.length) parts.push(`compressed resolution on ${pairs(compressedResolution)}`);
  if (!parts.length) parts.push("no pair sees unseen angles or compressed resolution");
  if (exceedsTrainedWindow.length)
    parts.push(`${pairs(exceedsTrainedWindow)} never complete a period in the trained window`);
  return parts.join("; ");
}

/** A layered plan's frozen result per layer group: which layers the plan scales and which it keeps as trained. */
export function GroupResults({ groups }: { groups: GroupResult[] }) {
  const rows: LayerGroupRow[] = groups.map((g) => ({
    ...g,
    scaling: g.method === "none" ? "nothing: no position encoding" : methodShort(g.method),
    note:
      g.method === "none"
        ? "never scaled"
        : `${g.scaled ? "takes the plan's method" : g.method === "default" ? "kept as trained" : "its own method"}; checked up to ${formatCount(g.checkedUpTo)} tokens: ${groupFlagWords(g)}`,
  }));
  return (
    <div data-testid="group-results">
      <LayerGroupsTable rows={rows} caption="Layer groups in this revision" />
    </div>
  );
}
