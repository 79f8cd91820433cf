import { AxisBottom, AxisLeft } from "@visx/axis";
import { Group } from "@visx/group";
import { scaleBand, scaleLinear } from "@visx/scale";
import { Line } from "@visx/shape";
import { columnPosition, type RetrievalGrid } from "../lib/chart-data";
import { AXIS } from "@/components/chart-axis";
import { ChartFrame, Key, TARGET, TRAINED, isNarrow, lengthLabel } from "./chart-frame";

const HEIGHT = 300;

/** Recall from 0 to 1 as a rope-colour ramp: signal red (lost) through hemp to seaglass (found every time). */
const shade = scaleLinear<string>({ domain: [0, 0.5, 1], range: ["#b23a2e", "#e0b36a", "#2d7a74"] });

type HeatmapProps = {
  grid: RetrievalGrid;
  kind: "passkey" | "needle";
  trainedContext: number;
  targetContext: number;
};

/**
 * Length × depth: each cell is Σ correct ÷ Σ trials at that length and depth (depth 0 = the start of the context,
 * 1 = its end). The trained and target lengths are drawn as lines across the columns.
 */
export function RetrievalHeatmap({ grid, kind, trainedContext, targetContext }: HeatmapProps) {
  const title = kind === "passkey" ? "Passkey retrieval by length and depth" : "Needle recall by length and depth";
  return (
    <ChartFrame
      title={title}
      caption="Each cell: share of trials answered correctly. Depth 0 is the start of the context, 1 its end."
      testId={`heatmap-${kind}`}
      height={HEIGHT}
      legend={
        <>
          <Key colour={TRAINED} label={`trained ${lengthLabel(trainedContext)}`} dashed />
          <Key colour={TARGET} label={`target ${lengthLabel(targetContext)}`} />
          <span className="inline-flex items-center gap-1.5">
            <span className="h-2 w-16 rounded-sm bg-gradient-to-r from-[#b23a2e] via-[#e0b36a] to-[#2d7a74]" />0 → 1
          </span>
        </>
      }
    >
      {(width) => {
        const narrow = isNarrow(width);
        const margin = { top: 18, right: 8, bottom: 40, left: narrow ? 36 : 48 };
        const innerW = Math.max(40, width - margin.left - margin.right);
        const innerH = HEIGHT - margin.top - margin.bottom;
        const x = scaleBand<number>({ domain: grid.lengths, range: [0, innerW], padding: 0.06 });
        const y = scaleBand<number>({ domain: grid.depths, range: [0, innerH], padding: 0.06 });
        const centre = (i: number) => (x(grid.lengths[i]!) ?? 0) + x.bandwidth() / 2;
        const marker = (value: number) => columnPosition(value, grid.lengths, centre, x.step());
        const everyOther = narrow && grid.lengths.length > 6;
        return (
          <svg width={width} height={HEIGHT} role="img" aria-label={`${title}: ${grid.cells.length} cells`}>
            <Group top={margin.top} left={margin.left}>
              {grid.cells.map((c) => (
                <rect
                  key={`${c.length}|${c.depth}`}
                  data-cell={`${c.length}|${c.depth}`}
                  x={x(c.length)}
                  y={y(c.depth)}
                  width={x.bandwidth()}
                  height={y.bandwidth()}
                  fill={shade(c.rate)}
                  rx={2}
                >
                  <title>{`${lengthLabel(c.length)} tokens, depth ${c.depth}: ${c.correct} of ${c.trials} correct`}</title>
                </rect>
              ))}
              {[
                { value: trainedContext, colour: TRAINED, label: "trained", dash: "5 3" },
                { value: targetContext, colour: TARGET, label: "target", dash: undefined },
              ].map((m, i) => {
                const at = marker(m.value);
                return (
                  <g key={m.label} data-marker={m.label}>
                    <Line
                      from={{ x: at, y: -4 }}
                      to={{ x: at, y: innerH }}
                      stroke={m.colour}
                      strokeWidth={2}
                      strokeDasharray={m.dash}
                    />
                    <text
                      x={at}
                      y={-6}
                      dx={i === 0 ? -3 : 3}
                      textAnchor={i === 0 ? "end" : "start"}
                      fontSize={10}
                      fill={m.colour}
                    >
                      {m.label}
                    </text>
                  </g>
                );
              })}
              <AxisLeft
                scale={y}
                tickFormat={(d) => String(d)}
                label={narrow ? undefined : "depth"}
                {...AXIS}
                tickLabelProps={{ ...AXIS.tickLabelProps, dy: "0.33em" }}
              />
              <AxisBottom
                top={innerH}
                scale={x}
                tickFormat={(d) => lengthLabel(Number(d))}
                tickValues={everyOther ? grid.lengths.filter((_, i) => i % 2 === 0) : grid.lengths}
                label="context length (tokens)"
                {...AXIS}
              />
            </Group>
          </svg>
        );
      }}
    </ChartFrame>
  );
}
