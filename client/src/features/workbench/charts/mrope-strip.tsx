import { mropeAxisSummary, mropeBands, type MropeAxis } from "@shared/mrope-axes";
import { layerRuns } from "@/components/layer-groups-table";

/** Multimodal sections of a profile: pairs per position axis, and whether they interleave. */
export type Sections = { section: number[]; interleaved: boolean };

export const AXIS_STYLE: Record<MropeAxis, { fill: string; label: string }> = {
  temporal: { fill: "#5b4a8a", label: "temporal" },
  height: { fill: "#2d7a74", label: "height" },
  width: { fill: "#9a5b1f", label: "width" },
};

export const STRIP_HEIGHT = 12;

/**
 * Bands over the pair axis, one colour per position axis (shared/mrope-axes.ts follows the loaders' order), drawn as a
 * strip along the bottom of the plot; contiguous sections wide enough carry their axis name.
 */
export function MropeStrip({
  sections,
  pairs,
  x,
  y,
}: {
  sections: Sections;
  pairs: number;
  x: (pair: number) => number;
  y: number;
}) {
  const bands = mropeBands(sections.section, sections.interleaved, pairs);
  return (
    <g data-testid="mrope-bands" aria-label="position axis of each pair">
      {bands.map((b) => {
        const left = x(b.from - 0.5);
        const w = x(b.to + 0.5) - left;
        return (
          <g key={`${b.axis}-${b.from}`} data-axis={b.axis}>
            <rect x={left} y={y} width={w} height={STRIP_HEIGHT} fill={AXIS_STYLE[b.axis].fill} fillOpacity={0.75} />
            {w > 60 && (
              <text
                x={left + w / 2}
                y={y + STRIP_HEIGHT - 2.5}
                textAnchor="middle"
                fontSize={9.5}
                fill="#fffdf8"
                fontFamily="IBM Plex Sans, sans-serif"
              >
                {AXIS_STYLE[b.axis].label}
              </text>
            )}
          </g>
        );
      })}
    </g>
  );
}

/**
 * The strip in words: which pairs each position axis rotates. The chart is one image to assistive technology (its
 * bands have no names of their own there), and the colours alone do not say where an interleaved band starts.
 */
export function MropeAxisList({ sections, pairs }: { sections: Sections; pairs: number }) {
  const axes = mropeAxisSummary(sections.section, sections.interleaved, pairs);
  return (
    <ul
      aria-label="Position axis of each pair"
      className="flex flex-col gap-0.5 text-note text-ink-soft"
      data-testid="mrope-axis-list"
    >
      {axes.map(({ axis, pairs: idx }) => (
        <li key={axis} data-axis={axis}>
          {`${AXIS_STYLE[axis].label}: ${idx.length} pair${idx.length === 1 ? "" : "s"} (${layerRuns(idx)})`}
        </li>
      ))}
    </ul>
  );
}
