import { useMemo, type PointerEvent } from "react";
import { AxisBottom, AxisLeft } from "@visx/axis";
import { localPoint } from "@visx/event";
import { Group } from "@visx/group";
import { scaleLinear, scaleLog } from "@visx/scale";
import { LinePath } from "@visx/shape";
import { useTooltip } from "@visx/tooltip";
import type { AnalysisResponse, Band, PairResult } from "@shared/schemas/analysis";
import { decades, shortTick, tokens } from "../figures";
import { METHOD_LABELS } from "../state/method-fields";
import {
  axisProps,
  ChartTooltip,
  HoverArea,
  HoverGuide,
  FlagMarker,
  Legend,
  MARGIN,
  ReferenceLine,
  Swatch,
} from "./chart-parts";
import { BAND_STYLE, FLAG_IDS, FLAG_STYLE, INK, methodColour, TARGET_LINE, TRAINED_LINE } from "./palette";
import { PairTooltipBody } from "./pair-tooltip";
import { useWidth } from "./use-width";
import { AXIS_STYLE, MropeAxisList, MropeStrip, STRIP_HEIGHT, type Sections } from "./mrope-strip";

type SpectrumChartProps = {
  analysis: AnalysisResponse;
  /** Which method of the analysis to draw against the original (index into analysis.methods). */
  methodIndex: number;
  height?: number;
  /** a profile with multimodal sections: bands over the pair axis, labelled by position axis */
  sections?: Sections | null;
  /** what each method is called (state/method-labels.ts); its method's name when absent */
  labels?: string[];
};

// Room above the plot for the band names, so they never sit on the data.
const M = { ...MARGIN, top: 30 };

/** Contiguous runs of one band along the pair index, for the background washes. */
function bandRuns(pairs: PairResult[]) {
  const runs: { band: Band; from: number; to: number }[] = [];
  for (const p of pairs) {
    const last = runs[runs.length - 1];
    if (last && last.band === p.band) last.to = p.index;
    else runs.push({ band: p.band, from: p.index, to: p.index });
  }
  return runs;
}

/**
 * Wavelength of every pair on a log axis, original and after one method, with the trained and target lengths,
 * the three bands as washes, and a marker on each flagged pair. Hover a pair for its exact values.
 */
export function SpectrumChart({ analysis, methodIndex, height = 340, sections = null, labels }: SpectrumChartProps) {
  const { ref, width } = useWidth<HTMLDivElement>();
  const tip = useTooltip<PairResult>();
  const index = Math.min(Math.max(methodIndex, 0), analysis.methods.length - 1);
  const method = analysis.methods[index];
  const pairs = method.pairs;
  const L = analysis.model.trainedContext,
    target = analysis.targetContext;
  const innerW = width - M.left - M.right,
    innerH = height - M.top - M.bottom;
  const colour = methodColour(index);
  const label = labels?.[index] ?? METHOD_LABELS[method.method];

  const { x, y } = useMemo(() => {
    const values = pairs.flatMap((p) => [p.wavelength, p.scaledWavelength]).concat([L, target]);
    return {
      x: scaleLinear({ domain: [-0.5, pairs.length - 0.5], range: [0, innerW] }),
      y: scaleLog({ domain: [Math.min(...values) / 1.5, Math.max(...values) * 1.8], range: [innerH, 0] }),
    };
  }, [pairs, L, target, innerW, innerH]);

  const onMove = (event: PointerEvent<SVGRectElement>) => {
    const point = localPoint(event.currentTarget.ownerSVGElement ?? event.currentTarget, event);
    if (!point) return;
    const i = Math.round(x.invert(point.x - M.left));
    const pair = pairs[Math.min(Math.max(i, 0), pairs.length - 1)];
    tip.showTooltip({
      tooltipData: pair,
      tooltipLeft: M.left + x(pair.index) + 12,
      tooltipTop: M.top + y(pair.scaledWavelength),
    });
  };

  return (
    <div className="flex flex-col gap-2">
      <div ref={ref} className="relative w-full" data-testid="spectrum-chart">
        <svg width={width} height={height} role="img" aria-label={`Wavelength per pair, original and ${label}`}>
          <Group left={M.left} top={M.top}>
            {bandRuns(pairs).map((run) => (
              <g key={`${run.band}-${run.from}`} data-band={run.band}>
                <rect
                  x={x(run.from - 0.5)}
                  width={x(run.to + 0.5) - x(run.from - 0.5)}
                  y={0}
                  height={innerH}
                  fill={BAND_STYLE[run.band].wash}
                />
                {x(run.to + 0.5) - x(run.from - 0.5) > 36 && (
                  <text
                    x={(x(run.from - 0.5) + x(run.to + 0.5)) / 2}
                    y={-8}
                    textAnchor="middle"
                    fontSize={11}
                    fontWeight={500}
                    fill={BAND_STYLE[run.band].text}
                    fontFamily="IBM Plex Sans, sans-serif"
                  >
                    {BAND_STYLE[run.band].label}
                  </text>
                )}
              </g>
            ))}
            <ReferenceLine
              y={y(L)}
              width={innerW}
              colour={TRAINED_LINE}
              label={`trained L = ${tokens(L)}`}
              labelAt="start"
            />
            <ReferenceLine
              y={y(target)}
              width={innerW}
              colour={TARGET_LINE}
              label={`target L′ = ${tokens(target)}`}
              dashed="2 3"
              labelAt="start"
            />
            <LinePath
              data={pairs}
              x={(p) => x(p.index)}
              y={(p) => y(p.wavelength)}
              stroke={INK}
              strokeWidth={1.5}
              strokeDasharray="4 3"
            />
            <LinePath
              data={pairs}
              x={(p) => x(p.index)}
              y={(p) => y(p.scaledWavelength)}
              stroke={colour}
              strokeWidth={2.25}
            />
            {pairs.map((p) => (
              <g key={p.index}>
                <circle cx={x(p.index)} cy={y(p.wavelength)} r={2} fill={INK} />
                <circle cx={x(p.index)} cy={y(p.scaledWavelength)} r={2.75} fill={colour} />
                {p.exceedsTrainedWindow && (
                  <FlagMarker flag="exceedsTrainedWindow" pair={p.index} x={x(p.index)} y={y(p.wavelength)} />
                )}
                {p.unseenAngles && (
                  <FlagMarker flag="unseenAngles" pair={p.index} x={x(p.index)} y={y(p.scaledWavelength) - 10} />
                )}
                {p.compressedResolution && (
                  <FlagMarker
                    flag="compressedResolution"
                    pair={p.index}
                    x={x(p.index)}
                    y={y(p.scaledWavelength) + 10}
                  />
                )}
              </g>
            ))}
            {tip.tooltipOpen && tip.tooltipData && <HoverGuide x={x(tip.tooltipData.index)} height={innerH} />}
            <AxisLeft
              scale={y}
              tickValues={decades(y.domain()[0], y.domain()[1])}
              tickFormat={(v) => shortTick(Number(v))}
              label="wavelength λ (tokens, log scale)"
              labelOffset={40}
              {...axisProps}
            />
            <AxisBottom
              top={innerH}
              scale={x}
              numTicks={Math.min(pairs.length, 16)}
              tickFormat={(v) => (Number.isInteger(Number(v)) ? String(v) : "")}
              label="pair index i (0 turns fastest)"
              {...axisProps}
            />
            {sections && <MropeStrip sections={sections} pairs={pairs.length} x={x} y={innerH - STRIP_HEIGHT} />}
            <HoverArea width={innerW} height={innerH} onMove={onMove} onLeave={tip.hideTooltip} testId="chart-hover" />
          </Group>
        </svg>
        {tip.tooltipOpen && tip.tooltipData && (
          <ChartTooltip left={tip.tooltipLeft ?? 0} top={tip.tooltipTop ?? 0}>
            <PairTooltipBody pair={tip.tooltipData} methodLabel={label} />
          </ChartTooltip>
        )}
      </div>
      <Legend
        items={[
          { key: "orig", swatch: <Swatch kind="line" colour={INK} dashed />, label: "original λ" },
          { key: "method", swatch: <Swatch kind="line" colour={colour} />, label: `λ′ after ${label}` },
          ...(["spinning", "turning", "drifting"] as const).map((b) => ({
            key: b,
            swatch: <Swatch kind="wash" colour={BAND_STYLE[b].wash} />,
            label: `${BAND_STYLE[b].label}: ${BAND_STYLE[b].plain}`,
          })),
          ...FLAG_IDS.map((f) => ({ key: f, swatch: <Swatch kind="marker" flag={f} />, label: FLAG_STYLE[f].label })),
          ...(sections
            ? (["temporal", "height", "width"] as const).map((a) => ({
                key: a,
                swatch: <Swatch kind="wash" colour={AXIS_STYLE[a].fill} />,
                label: `${AXIS_STYLE[a].label} axis (mrope_section ${sections.interleaved ? "interleaved" : "in blocks"})`,
              }))
            : []),
        ]}
      />
      {sections && <MropeAxisList sections={sections} pairs={pairs.length} />}
    </div>
  );
}
