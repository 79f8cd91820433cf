import { useMemo, type PointerEvent } from "react";
import { AxisBottom, AxisLeft } from "@visx/axis";
import { localPoint } from "@visx/event";
import { Group } from "@visx/group";
import { scaleLinear, scaleLog } from "@visx/scale";
import { LinePath } from "@visx/shape";
import { useTooltip } from "@visx/tooltip";
import type { AnalysisResponse } from "@shared/schemas/analysis";
import { oneTwoFive, sig } from "../figures";
import { METHOD_LABELS } from "../state/method-fields";
import { axisProps, ChartTooltip, HoverArea, HoverGuide, Legend, MARGIN, ReferenceLine, Swatch } from "./chart-parts";
import { INK, INK_SOFT, methodColour } from "./palette";
import { useWidth } from "./use-width";

/** θ′/θ of every pair for every method: 1 = pair kept as trained, 1/s = pair interpolated by the full factor. */
export function RatioChart({
  analysis,
  height = 280,
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
  const n = analysis.model.pairs;
  const series = useMemo(
    () => analysis.methods.map((m) => m.pairs.map((p) => ({ i: p.index, ratio: p.scaledInvFreq / p.invFreq }))),
    [analysis],
  );
  const { x, y } = useMemo(() => {
    const values = series
      .flat()
      .map((d) => d.ratio)
      .concat([1, 1 / analysis.scale]);
    const lo = Math.min(...values),
      hi = Math.max(...values);
    return {
      x: scaleLinear({ domain: [0, n - 1], range: [0, innerW] }),
      y: scaleLog({ domain: [lo / 1.3, hi * 1.3], range: [innerH, 0] }),
    };
  }, [series, analysis.scale, n, innerW, innerH]);
  const ticks = oneTwoFive(y.domain()[0], y.domain()[1]);

  const onMove = (event: PointerEvent<SVGRectElement>) => {
    const point = localPoint(event.currentTarget.ownerSVGElement ?? event.currentTarget, event);
    if (!point) return;
    const i = Math.min(Math.max(Math.round(x.invert(point.x - MARGIN.left)), 0), n - 1);
    tip.showTooltip({ tooltipData: i, tooltipLeft: MARGIN.left + x(i) + 12, tooltipTop: MARGIN.top + 8 });
  };

  return (
    <div className="flex flex-col gap-2">
      <div ref={ref} className="relative w-full" data-testid="ratio-chart">
        <svg width={width} height={height} role="img" aria-label="Scale ratio θ′/θ per pair, one line per method">
          <Group left={MARGIN.left} top={MARGIN.top}>
            <ReferenceLine y={y(1)} width={innerW} colour={INK} label="1: kept as trained" />
            {analysis.scale > 1 && (
              <ReferenceLine
                y={y(1 / analysis.scale)}
                width={innerW}
                colour={INK_SOFT}
                label={`1/s = 1/${sig(analysis.scale, 4)}`}
                dashed="2 3"
                labelAt="start"
              />
            )}
            {series.map((data, k) => (
              <LinePath
                key={k}
                data={data}
                x={(d) => x(d.i)}
                y={(d) => y(d.ratio)}
                stroke={methodColour(k)}
                strokeWidth={2.25}
                data-method={analysis.methods[k].method}
              />
            ))}
            {tip.tooltipOpen && tip.tooltipData !== undefined && <HoverGuide x={x(tip.tooltipData)} height={innerH} />}
            <AxisLeft
              scale={y}
              tickValues={ticks}
              tickFormat={(v) => sig(Number(v), 2)}
              label="θ′/θ (log scale)"
              labelOffset={44}
              {...axisProps}
            />
            <AxisBottom top={innerH} scale={x} numTicks={Math.min(n, 16)} label="pair index i" {...axisProps} />
            <HoverArea width={innerW} height={innerH} onMove={onMove} onLeave={tip.hideTooltip} />
          </Group>
        </svg>
        {tip.tooltipOpen && tip.tooltipData !== undefined && (
          <ChartTooltip left={tip.tooltipLeft ?? 0} top={tip.tooltipTop ?? 0}>
            <p className="font-semibold">Pair {tip.tooltipData}</p>
            {analysis.methods.map((m, k) => (
              <p key={k} style={{ color: methodColour(k) }}>
                {labels?.[k] ?? METHOD_LABELS[m.method]}: θ′/θ = {sig(series[k][tip.tooltipData!].ratio, 6)}
              </p>
            ))}
          </ChartTooltip>
        )}
      </div>
      <Legend
        items={analysis.methods.map((m, k) => ({
          key: String(k),
          swatch: <Swatch kind="line" colour={methodColour(k)} />,
          label: `${k + 1}. ${labels?.[k] ?? METHOD_LABELS[m.method]}`,
        }))}
      />
    </div>
  );
}
