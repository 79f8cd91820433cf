import { useId } from "react";
import type { LayerGroup } from "@shared/schemas/models";
import { NO_ROPE, scaledGroupIndex } from "@shared/layer-groups";

const WORDS: Record<string, string> = { full_attention: "full attention", sliding_attention: "local window" };
const label = (g: LayerGroup, scaled: boolean) =>
  `${WORDS[g.kind] ?? g.kind.replace(/_/g, " ")} — ${g.layers.length} layers, b ${g.ropeTheta}, d ${g.rotaryDim}` +
  (g.slidingWindow ? `, window ${g.slidingWindow}` : "") +
  (scaled ? " (scaled by plans)" : "");

/** The group asked for, if it rotates; else the group scaling applies to. */
export function pickGroup(groups: LayerGroup[], kind: string | undefined): LayerGroup | undefined {
  const asked = groups.find((g) => g.kind === kind && g.kind !== NO_ROPE);
  return asked ?? groups[scaledGroupIndex(groups)];
}

/** Layered models: which layer group the workbench analyses, one at a time. Layers without rotary are not offered. */
export function GroupPicker({
  groups,
  value,
  onChange,
}: {
  groups: LayerGroup[];
  value: string;
  onChange: (kind: string) => void;
}) {
  const id = useId();
  const scaled = scaledGroupIndex(groups);
  return (
    <div className="flex flex-wrap items-center gap-2">
      <label htmlFor={id} className="text-note font-semibold text-ink">
        Layer group
      </label>
      <select
        id={id}
        value={value}
        onChange={(e) => onChange(e.target.value)}
        className="rounded-md border border-rule-strong bg-paper px-2 py-1 text-body"
      >
        {groups.map((g, i) =>
          g.kind === NO_ROPE ? null : (
            <option key={g.kind} value={g.kind}>
              {label(g, i === scaled)}
            </option>
          ),
        )}
      </select>
      <span className="text-note text-ink-soft">
        Each group has its own base; local-window layers are best left as trained.
      </span>
    </div>
  );
}
