import type { CurrentScaling, LayerGroup } from "@shared/schemas/models";
import { LayerGroupsTable, type LayerGroupRow } from "@/components/layer-groups-table";

const scalingWords = (s: CurrentScaling | null, kind: string) => {
  if (kind === "no_rope") return "nothing: no position encoding";
  if (!s || s.method === "default") return "plain RoPE, unscaled";
  const factor = typeof s.params.factor === "number" ? ` ×${s.params.factor}` : "";
  return `${s.method}${factor} (as shipped)`;
};

/** The profile's layer groups, with a line saying which one a plan scales; shown only when there is more than one. */
export function ProfileLayerGroups({ groups }: { groups: LayerGroup[] | null | undefined }) {
  if (!groups || groups.length < 2) return null;
  const rows: LayerGroupRow[] = groups.map((g) => ({
    ...g,
    scaling: scalingWords(g.currentScaling, g.kind),
    note:
      g.kind === "full_attention"
        ? "a plan scales these layers"
        : g.kind === "no_rope"
          ? "never scaled"
          : "kept as trained unless a plan says otherwise",
  }));
  return (
    <div className="flex flex-col gap-2" data-testid="profile-layer-groups">
      <h3 className="text-lead font-semibold text-ink">Layers by rotary setting</h3>
      <LayerGroupsTable rows={rows} />
    </div>
  );
}
