import type { PointerEvent, ReactNode } from "react";
import { TooltipWithBounds } from "@visx/tooltip";
import { axisLook } from "@/components/chart-axis";
import { FLAG_STYLE, INK, INK_SOFT, RULE, type FlagId } from "./palette";

export const MARGIN = { top: 16, right: 20, bottom: 48, left: 64 };

/** The workbench's axes: ink-soft ticks in the body font, on the lighter rule. */
export const axisProps = axisLook({
  line: RULE,
  text: INK_SOFT,
  labelSize: 12,
  fontFamily: "IBM Plex Sans, sans-serif",
});

/** One marker shape per flag, centred on (x, y). Legend swatches pass pair −1: no title, no test hooks. */
export function FlagMarker({ flag, x, y, pair }: { flag: FlagId; x: number; y: number; pair: number }) {
  const { colour, marker, label } = FLAG_STYLE[flag];
  const onChart = pair >= 0;
  const props = {
    ...(onChart ? { "data-testid": "flag-marker", "data-flag": flag, "data-pair": pair } : {}),
    stroke: colour,
    strokeWidth: 1.5,
  };
  const title = onChart ? <title>{`Pair ${pair}: ${label}`}</title> : null;
  if (marker === "ring")
    return (
      <circle {...props} cx={x} cy={y} r={6} fill="none">
        {title}
      </circle>
    );
  const d =
    marker === "triangle"
      ? `M${x},${y - 7} L${x + 6},${y + 4} L${x - 6},${y + 4} Z`
      : `M${x},${y - 6} L${x + 5},${y} L${x},${y + 6} L${x - 5},${y} Z`;
  return (
    <path
      {...props}
      d={d}
      fill={marker === "triangle" ? colour : "white"}
      fillOpacity={marker === "triangle" ? 0.85 : 1}
    >
      {title}
    </path>
  );
}

/** A swatch for the HTML legends: a line, a wash, or a flag's marker. */
export function Swatch({
  kind,
  colour,
  flag,
  dashed,
}: {
  kind: "line" | "wash" | "marker";
  colour?: string;
  flag?: FlagId;
  dashed?: boolean;
}) {
  return (
    <svg width={18} height={14} aria-hidden className="shrink-0">
      {kind === "line" && (
        <line
          x1={1}
          x2={17}
          y1={7}
          y2={7}
          stroke={colour}
          strokeWidth={2.5}
          strokeDasharray={dashed ? "4 3" : undefined}
        />
      )}
      {kind === "wash" && <rect x={1} y={1} width={16} height={12} rx={2} fill={colour} stroke={RULE} />}
      {kind === "marker" && flag && <FlagMarker flag={flag} x={9} y={7} pair={-1} />}
    </svg>
  );
}

export function Legend({ items }: { items: { key: string; swatch: ReactNode; label: ReactNode }[] }) {
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-note text-ink-soft" aria-label="Legend">
      {items.map((i) => (
        <li key={i.key} className="inline-flex items-center gap-1.5">
          {i.swatch}
          {i.label}
        </li>
      ))}
    </ul>
  );
}

export function ChartTooltip({ left, top, children }: { left: number; top: number; children: ReactNode }) {
  return (
    <TooltipWithBounds
      left={left}
      top={top}
      unstyled
      applyPositionStyle
      className="pointer-events-none z-10 max-w-xs rounded-md border border-rule-strong bg-paper px-3 py-2 text-note text-ink shadow-md"
    >
      <div data-testid="chart-tooltip">{children}</div>
    </TooltipWithBounds>
  );
}

type ReferenceLineProps = {
  y: number;
  width: number;
  colour: string;
  label: string;
  dashed?: string;
  labelAt?: "start" | "end";
};

/** A horizontal reference line across the plot, labelled at whichever end the data leaves free. */
export function ReferenceLine({ y, width, colour, label, dashed = "6 4", labelAt = "end" }: ReferenceLineProps) {
  return (
    <g>
      <line x1={0} x2={width} y1={y} y2={y} stroke={colour} strokeWidth={1.25} strokeDasharray={dashed} />
      <text
        x={labelAt === "end" ? width - 4 : 4}
        y={y - 4}
        textAnchor={labelAt}
        fontSize={11}
        fill={colour}
        fontFamily="IBM Plex Sans, sans-serif"
        paintOrder="stroke"
        stroke="white"
        strokeWidth={3}
      >
        {label}
      </text>
    </g>
  );
}

/** The faint vertical line at the hovered position, from the plot's top to its axis. */
export function HoverGuide({ x, height }: { x: number; height: number }) {
  return <line x1={x} x2={x} y1={0} y2={height} stroke={INK} strokeOpacity={0.35} />;
}

/** The plot's transparent top layer that hears the pointer, so hovering anywhere (not only on a line) shows a tip. */
export function HoverArea({
  width,
  height,
  onMove,
  onLeave,
  testId,
}: {
  width: number;
  height: number;
  onMove: (event: PointerEvent<SVGRectElement>) => void;
  onLeave: () => void;
  testId?: string;
}) {
  return (
    <rect
      width={width}
      height={height}
      fill="transparent"
      onPointerMove={onMove}
      onPointerLeave={onLeave}
      data-testid={testId}
    />
  );
}
