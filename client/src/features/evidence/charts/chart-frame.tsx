import type { ReactNode } from "react";
import { ParentSize } from "@visx/responsive";

export const TRAINED = "var(--color-ink)";
export const TARGET = "var(--color-hemp)";
export const TUNED = "var(--color-seaglass)";
export const BASELINE = "var(--color-rule-strong)";
export const SIGNAL = "var(--color-signal)";

/** k = 1024, the way context lengths are spoken of ("32k"). */
export const lengthLabel = (v: number) => (v >= 1024 && v % 1024 === 0 ? `${v / 1024}k` : String(v));

/** Narrow screens get tighter margins and fewer ticks; 390 px phones still fit every chart. */
export const isNarrow = (width: number) => width < 520;

type ChartFrameProps = {
  title: string;
  /** what the chart shows, for screen readers and as the caption under the title */
  caption: string;
  testId: string;
  height: number;
  children: (width: number) => ReactNode;
  legend?: ReactNode;
};

/** A figure that takes its parent's width (visx ParentSize) and keeps a fixed height. */
export function ChartFrame({ title, caption, testId, height, children, legend }: ChartFrameProps) {
  return (
    <figure className="flex min-w-0 flex-col gap-1" data-testid={testId}>
      <figcaption className="flex flex-col">
        <span className="text-note font-semibold">{title}</span>
        <span className="text-note text-ink-soft">{caption}</span>
      </figcaption>
      <div style={{ height }} className="w-full min-w-0">
        <ParentSize debounceTime={50}>{({ width }) => (width > 0 ? children(Math.floor(width)) : null)}</ParentSize>
      </div>
      {legend && <div className="flex flex-wrap gap-x-4 gap-y-1 text-note text-ink-soft">{legend}</div>}
    </figure>
  );
}

/** A swatch and its words, for legends. */
export function Key({ colour, label, dashed = false }: { colour: string; label: string; dashed?: boolean }) {
  return (
    <span className="inline-flex items-center gap-1.5">
      <svg width="18" height="8" aria-hidden="true">
        <line
          x1="0"
          x2="18"
          y1="4"
          y2="4"
          stroke={colour}
          strokeWidth={2}
          strokeDasharray={dashed ? "4 3" : undefined}
        />
      </svg>
      {label}
    </span>
  );
}
