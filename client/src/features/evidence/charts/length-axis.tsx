import { AxisBottom } from "@visx/axis";
import { scaleLog } from "@visx/scale";
import { Line } from "@visx/shape";
import { AXIS, powerOfTwoTicks } from "@/components/chart-axis";
import { lengthLabel } from "./chart-frame";

/** A log2 length scale covering the measured lengths and the marked ones, padded a little either side. */
export function lengthScale(values: number[], innerW: number) {
  const lo = Math.min(...values);
  const hi = Math.max(...values);
  const domain: [number, number] = [lo / 1.25, hi === lo ? hi * 2 : hi * 1.25];
  return scaleLog<number>({ domain, range: [0, innerW], base: 2 });
}

export function LengthAxis({
  scale,
  top,
  maxTicks,
}: {
  scale: ReturnType<typeof lengthScale>;
  top: number;
  maxTicks: number;
}) {
  const [lo, hi] = scale.domain() as [number, number];
  return (
    <AxisBottom
      top={top}
      scale={scale}
      tickValues={powerOfTwoTicks(lo, hi, maxTicks)}
      tickFormat={(v) => lengthLabel(Number(v))}
      label="context length (tokens, log scale)"
      {...AXIS}
    />
  );
}

/** A vertical line at a length, labelled at the top. */
export function LengthMarker({
  x,
  height,
  colour,
  label,
  dashed = false,
  anchor = "start",
}: {
  x: number;
  height: number;
  colour: string;
  label: string;
  dashed?: boolean;
  anchor?: "start" | "end";
}) {
  return (
    <g data-marker={label.split(" ")[0]}>
      <Line
        from={{ x, y: 0 }}
        to={{ x, y: height }}
        stroke={colour}
        strokeWidth={1.5}
        strokeDasharray={dashed ? "5 3" : undefined}
      />
      <text x={x} dx={anchor === "start" ? 3 : -3} y={10} textAnchor={anchor} fontSize={10} fill={colour}>
        {label}
      </text>
    </g>
  );
}
