import { useMemo, type PointerEvent } from "react";
import { AxisBottom, AxisLeft } from "@visx/axis";
import { localPoint } from "@visx/event";
import { Group } from "@visx/group";
import { scaleLinear, scaleLog } from "@visx/scale";
import { LinePath } from "@visx/shape";
import { useTooltip } from "@visx/tooltip";
import type { AnalysisResponse } from "@shared/schemas/analysis";
import { decades, shortTick, sig, tokens } from "../figures";
import { METHOD_LABELS } from "../state/method-fields";
import { axisProps, ChartTooltip, HoverArea, HoverGuide, Legend, MARGIN, Swatch } from "./chart-parts";
import { INK, methodColour, TARGET_LINE, TRAINED_LINE } from "./palette";
import { useWidth } from "./use-width";

/** A vertical reference line at a position, labelled at the top. */
function PositionLine({
  x,
  height,
  colour,
  label,
  dashed,
}: {
  x: number;
  height: number;
  colour: string;
  label: string;
  dashed: string;
}) {
  return (
    <g>
      <line x1={x} x2={x} y1={0} y2={height} stroke={colour} strokeWidth={1.25} strokeDasharray={dashed} />
      <text x={x - 4} y={12} textAnchor="end" fontSize={11} fill={colour} fontFamily="IBM Plex Sans, sans-serif">
        {label}
      </text>
    </g>
  );
}

/**
 * The long-term decay bound R(m) of RoFormer §3.4.3 against relative distance m (log axis), for the original
 * frequencies and each method. Position 0 is left out: the log axis starts at 1.
 */
export function DecayChart({
  analysis,
  height = 300,
  labels,
}: {
  analysis: AnalysisResponse;
  height?: number;
  /** what each method is called (methodLabels); its method's name when absent */
  labels?: string[];
}) {
  const { ref, width } = useWidth<HTMLDivElement>();
  const tip = useTooltip<number>();
  const innerW = width - MARGIN.left - MARGIN.right,
    innerH = height - MARGIN.top - MARGIN.bottom;
  const { positions, original, byMethod } = analysis.decay;
  const L = analysis.model.trainedContext,
    target = analysis.targetContext;

  const series = useMemo(() => {
    const keep = positions.map((m, k) => (m >= 1 ? k : -1)).filter((k) => k >= 0);
    const curve = (values: number[]) => keep.map((k) => ({ m: positions[k], r: values[k] }));
    return { original: curve(original), methods: analysis.methods.map((_m, i) => curve(byMethod[String(i)] ?? [])) };
  }, [positions, original, byMethod, analysis.methods]);

  const { x, y } = useMemo(() => {
    const all = series.original.concat(series.methods.flat());
    const maxM = Math.max(target, ...all.map((d) => d.m));
    return {
      x: scaleLog({ domain: [1, maxM], range: [0, innerW] }),
      y: scaleLinear({ domain: [0, Math.max(...all.map((d) => d.r)) * 1.05], range: [innerH, 0], nice: true }),
    };
  }, [series, target, innerW, innerH]);

  const onMove = (event: PointerEvent<SVGRectElement>) => {
    const point = localPoint(event.currentTarget.ownerSVGElement ?? event.currentTarget, event);
    if (!point) return;
    const m = x.invert(point.x - MARGIN.left);
    let best = 0;
    series.original.forEach((d, k) => {
      if (Math.abs(Math.log(d.m / m)) < Math.abs(Math.log(series.original[best].m / m))) best = k;
    });
    tip.showTooltip({
      tooltipData: best,
      tooltipLeft: MARGIN.left + x(series.original[best].m) + 12,
      tooltipTop: MARGIN.top + 8,
    });
  };
  const hovered = tip.tooltipData;

  return (
    <div className="flex flex-col gap-2">
      <div ref={ref} className="relative w-full" data-testid="decay-chart">
        <svg width={width} height={height} role="img" aria-label="Long-term decay curve R(m), original and each method">
          <Group left={MARGIN.left} top={MARGIN.top}>
            <PositionLine x={x(L)} height={innerH} colour={TRAINED_LINE} label={`L = ${tokens(L)}`} dashed="6 4" />
            <PositionLine
              x={x(target)}
              height={innerH}
              colour={TARGET_LINE}
              label={`L′ = ${tokens(target)}`}
              dashed="2 3"
            />
            <LinePath
              data={series.original}
              x={(d) => x(d.m)}
              y={(d) => y(d.r)}
              stroke={INK}
              strokeWidth={1.75}
              strokeDasharray="4 3"
            />
            {series.methods.map((data, k) => (
              <LinePath
                key={k}
                data={data}
                x={(d) => x(d.m)}
                y={(d) => y(d.r)}
                stroke={methodColour(k)}
                strokeWidth={2.25}
              />
            ))}
            {tip.tooltipOpen && hovered !== undefined && (
              <HoverGuide x={x(series.original[hovered].m)} height={innerH} />
            )}
            <AxisLeft scale={y} numTicks={5} label="R(m), relative bound" labelOffset={40} {...axisProps} />
            <AxisBottom
              top={innerH}
              scale={x}
              tickValues={decades(1, x.domain()[1])}
              tickFormat={(v) => shortTick(Number(v))}
              label="relative distance m (tokens, log scale)"
              {...axisProps}
            />
            <HoverArea width={innerW} height={innerH} onMove={onMove} onLeave={tip.hideTooltip} />
          </Group>
        </svg>
        {tip.tooltipOpen && hovered !== undefined && (
          <ChartTooltip left={tip.tooltipLeft ?? 0} top={tip.tooltipTop ?? 0}>
            <p className="font-semibold">m = {tokens(series.original[hovered].m)} tokens</p>
            <p>original: R = {sig(series.original[hovered].r, 5)}</p>
            {analysis.methods.map((mr, k) => (
              <p key={k} style={{ color: methodColour(k) }}>
                {labels?.[k] ?? METHOD_LABELS[mr.method]}: R = {sig(series.methods[k][hovered]?.r ?? NaN, 5)}
              </p>
            ))}
          </ChartTooltip>
        )}
      </div>
      <Legend
        items={[
          { key: "orig", swatch: <Swatch kind="line" colour={INK} dashed />, label: "original" },
          ...analysis.methods.map((m, k) => ({
            key: String(k),
            swatch: <Swatch kind="line" colour={methodColour(k)} />,
            label: `${k + 1}. ${labels?.[k] ?? METHOD_LABELS[m.method]}`,
          })),
        ]}
      />
    </div>
  );
}
