/*
 * The axis set-up the visx charts share (evidence, budget and workbench charts). visx's AxisBottom already centres
 * its tick labels and AxisLeft ends them at the tick (defaults merged under ours: @visx/axis 4.0.0,
 * esm/axis/AxisBottom.js `bottomTickLabelProps`, esm/axis/AxisLeft.js `leftTickLabelProps`), so no chart passes
 * a textAnchor for its tick labels.
 */

type AxisLookOptions = {
  /** The axis line and tick marks. */
  line: string;
  /** Tick labels and the axis label. */
  text: string;
  /** The axis label's size; tick labels are 11 px. */
  labelSize?: number;
  /** Left out, the labels keep visx's own font. */
  fontFamily?: string;
};

/** Props to spread on a visx AxisLeft or AxisBottom: one look for every axis of a chart family. */
export function axisLook({ line, text, labelSize = 11, fontFamily }: AxisLookOptions) {
  const font = fontFamily ? { fontFamily } : {};
  return {
    stroke: line,
    tickStroke: line,
    tickLabelProps: { fill: text, fontSize: 11, ...font },
    labelProps: { fill: text, fontSize: labelSize, ...font, textAnchor: "middle" as const },
  };
}

/** The evidence and budget charts' axes, in the palette's tokens (index.css). */
export const AXIS = axisLook({ line: "var(--color-rule-strong)", text: "var(--color-ink-soft)" });

/** Powers of two from lo to hi (context lengths), thinned to at most `max` ticks. */
export function powerOfTwoTicks(lo: number, hi: number, max: number): number[] {
  const ticks: number[] = [];
  for (let p = 2 ** Math.ceil(Math.log2(lo)); p <= hi; p *= 2) ticks.push(p);
  const step = Math.ceil(ticks.length / Math.max(1, max));
  return ticks.filter((_, i) => i % step === 0);
}
