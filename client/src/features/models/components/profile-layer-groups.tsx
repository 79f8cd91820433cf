import type { CurrentScaling, LayerGroup } from "@shared/schemas/models";
import { NO_ROPE, scaledGroupIndex } from "@shared/layer-groups";
import { LayerGroupsTable, type LayerGroupRow } from "@/components/layer-groups-table";

const scalingWords = (s: CurrentScaling | null, kind: string) => {
  if (kind === NO_ROPE) return "nothing: no position encoding";
  if (!s || s.method === "default") return "plain RoPE, unscaled";
  const factor = typeof s.params.factor === "number" ? ` ×${s.params.factor}` : "";
  return `${s.method}${factor} (as shipped)`;
};

/** The table rows: each group's scaling as shipped, and which group a plan scales. */
export function profileGroupRows(groups: LayerGroup[]): LayerGroupRow[] {
  // The group plans scale is the server's rule (shared/layer-groups.ts), not always the full-attention one: a model
  // without full-attention layers has its first rotating group scaled.
  const scaled = scaledGroupIndex(groups);
  return groups.map((g, i) => ({
    ...g,
    scaling: scalingWords(g.currentScaling, g.kind),
    note:
      i === scaled && g.kind !== NO_ROPE
        ? "a plan scales these layers"
        : g.kind === NO_ROPE
          ? "never scaled"
          : "kept as trained unless a plan says otherwise",
  }));
}

/** The profile's layer groups, with a line saying which one a plan scales; shown only when there is more than one. */
export function ProfileLayerGroups({ groups }: { groups: LayerGroup[] | null | undefined }) {
  if (!groups || groups.length < 2) return null;
  const rows = profileGroupRows(groups);
  return (
    <div className="flex flex-col gap-2" data-testid="profile-layer-groups">
      <h3 className="text-lead font-semibold text-ink">Layers by rotary setting</h3>
      <LayerGroupsTable rows={rows} />
    </div>
  );
}
