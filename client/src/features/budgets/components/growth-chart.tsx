import { AxisBottom, AxisLeft } from "@visx/axis";
import { GridRows } from "@visx/grid";
import { Group } from "@visx/group";
import { scaleLinear, scaleLog } from "@visx/scale";
import { Line, LinePath } from "@visx/shape";
import type { BudgetEstimateResponse } from "@shared/schemas/budget";
import { AXIS, powerOfTwoTicks } from "@/components/chart-axis";
import { formatMoney, formatScientific } from "@/lib/format";
import { formatLength } from "./chart-colors";

type Growth = BudgetEstimateResponse["growth"];
type Point = { x: number; y: number };
type Marker = { x: number; label: string };

const WIDTH = 420;
const HEIGHT = 240;
const MARGIN = { top: 16, right: 16, bottom: 44, left: 72 };

function LogLinePanel({
  title,
  points,
  yFormat,
  markers,
  color,
}: {
  title: string;
  points: Point[];
  yFormat: (v: number) => string;
  markers: Marker[];
  color: string;
}) {
  const innerW = WIDTH - MARGIN.left - MARGIN.right;
  const innerH = HEIGHT - MARGIN.top - MARGIN.bottom;
  const xs = points.map((p) => p.x);
  const lo = Math.min(...xs);
  const hi = Math.max(...xs);
  const x = scaleLog<number>({ domain: [lo, hi === lo ? lo * 2 : hi], range: [0, innerW], base: 2 });
  const y = scaleLinear<number>({
    domain: [0, Math.max(...points.map((p) => p.y)) * 1.05 || 1],
    range: [innerH, 0],
    nice: true,
  });
  return (
    <figure className="flex flex-col gap-1">
      <figcaption className="text-note font-semibold">{title}</figcaption>
      <svg viewBox={`0 0 ${WIDTH} ${HEIGHT}`} width="100%" role="img" aria-label={`${title} against sequence length`}>
        <Group top={MARGIN.top} left={MARGIN.left}>
          <GridRows scale={y} width={innerW} numTicks={4} stroke="var(--color-rule)" />
          {markers.map((m) => (
            <g key={m.label}>
              <Line
                from={{ x: x(m.x), y: 0 }}
                to={{ x: x(m.x), y: innerH }}
                stroke="var(--color-ink-soft)"
                strokeDasharray="3 3"
              />
              <text x={x(m.x) + 4} y={10} fontSize={11} fill="var(--color-ink-soft)">
                {m.label}
              </text>
            </g>
          ))}
          <LinePath data={points} x={(p) => x(p.x)} y={(p) => y(p.y)} stroke={color} strokeWidth={2} />
          {points.map((p) => (
            <circle key={p.x} cx={x(p.x)} cy={y(p.y)} r={3} fill={color}>
              <title>{`${formatLength(p.x)} tokens: ${yFormat(p.y)}`}</title>
            </circle>
          ))}
          <AxisLeft scale={y} numTicks={4} tickFormat={(v) => yFormat(Number(v))} {...AXIS} />
          <AxisBottom
            top={innerH}
            scale={x}
            tickValues={powerOfTwoTicks(lo, hi, 6)}
            tickFormat={(v) => formatLength(Number(v))}
            label="Sequence length (tokens, log scale; k = 1024)"
            {...AXIS}
          />
        </Group>
      </svg>
    </figure>
  );
}

/** How FLOPs per token and cost per billion tokens grow with length, from the trained length to 4 × the target. */
export function GrowthChart({
  growth,
  trainedContext,
  targetContext,
  currency,
}: {
  growth: Growth;
  trainedContext: number;
  targetContext: number;
  /** The workspace currency of the cost curve. */
  currency: string;
}) {
  const markers = [
    { x: trainedContext, label: "trained" },
    ...(targetContext !== trainedContext ? [{ x: targetContext, label: "target" }] : []),
  ];
  return (
    <div className="grid gap-4 md:grid-cols-2" data-testid="growth-chart">
      <LogLinePanel
        title="Training FLOPs per token"
        points={growth.map((g) => ({ x: g.sequenceLength, y: g.flopsPerToken }))}
        yFormat={formatScientific}
        markers={markers}
        color="var(--color-hemp)"
      />
      <LogLinePanel
        title="Cost per billion tokens"
        points={growth.map((g) => ({ x: g.sequenceLength, y: g.costPerBillionTokens }))}
        yFormat={(v) => formatMoney(v, currency)}
        markers={markers}
        color="var(--color-seaglass)"
      />
      <p className="text-note text-ink-soft md:col-span-2">
        The attention term is {Math.round((growth[0]?.attentionShare ?? 0) * 100)} % of the FLOPs per token at{" "}
        {formatLength(growth[0]?.sequenceLength ?? 0)} and{" "}
        {Math.round((growth[growth.length - 1]?.attentionShare ?? 0) * 100)} % at{" "}
        {formatLength(growth[growth.length - 1]?.sequenceLength ?? 0)}.
      </p>
    </div>
  );
}
