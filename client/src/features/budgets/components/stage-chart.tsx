import { AxisBottom } from "@visx/axis";
import { Group } from "@visx/group";
import { scaleBand, scaleLinear } from "@visx/scale";
import { BarStackHorizontal } from "@visx/shape";
import type { BudgetEstimateResponse } from "@shared/schemas/budget";
import { AXIS } from "@/components/chart-axis";
import { formatCount, formatHours } from "@/lib/format";
import { stageColor } from "./chart-colors";

type Stage = BudgetEstimateResponse["stages"][number];
type Row = { metric: string } & Record<string, number | string>;

const WIDTH = 640;
const MARGIN = { top: 8, right: 16, bottom: 32, left: 132 };
const ROW_HEIGHT = 36;

/**
 * Two bars, each split by stage: the share of tokens and the share of accelerator-hours.
 * Units differ, so each bar is its own 100 %; a long stage takes more of the hours than of the tokens.
 */
export function StageShareChart({ stages }: { stages: Stage[] }) {
  const keys = stages.map((s) => `stage${s.index}`);
  const totalTokens = stages.reduce((t, s) => t + s.tokens, 0) || 1;
  const totalHours = stages.reduce((t, s) => t + s.acceleratorHours, 0) || 1;
  const rows: Row[] = [
    { metric: "Tokens", ...Object.fromEntries(stages.map((s) => [`stage${s.index}`, s.tokens / totalTokens])) },
    {
      metric: "Accelerator-hours",
      ...Object.fromEntries(stages.map((s) => [`stage${s.index}`, s.acceleratorHours / totalHours])),
    },
  ];
  const innerWidth = WIDTH - MARGIN.left - MARGIN.right;
  const height = MARGIN.top + MARGIN.bottom + rows.length * ROW_HEIGHT;
  const xScale = scaleLinear<number>({ domain: [0, 1], range: [0, innerWidth] });
  const yScale = scaleBand<string>({
    domain: rows.map((r) => r.metric),
    range: [0, rows.length * ROW_HEIGHT],
    padding: 0.25,
  });
  const absolute = (metric: string, s: Stage) =>
    metric === "Tokens" ? `${formatCount(s.tokens)} tokens` : formatHours(s.acceleratorHours);

  return (
    <figure className="flex flex-col gap-2">
      <svg
        viewBox={`0 0 ${WIDTH} ${height}`}
        width="100%"
        role="img"
        aria-label="Share of tokens and of accelerator-hours by stage"
        data-testid="stage-chart"
      >
        <Group top={MARGIN.top} left={MARGIN.left}>
          <BarStackHorizontal<Row, string>
            data={rows}
            keys={keys}
            y={(r) => r.metric}
            xScale={xScale}
            yScale={yScale}
            color={(key) => stageColor(keys.indexOf(key))}
          >
            {(stacks) =>
              stacks.map((stack, k) =>
                stack.bars.map((bar) => (
                  <rect
                    key={`${stack.key}-${bar.index}`}
                    x={bar.x}
                    y={bar.y}
                    width={Math.max(0, bar.width)}
                    height={bar.height}
                    fill={bar.color}
                    stroke="var(--color-paper)"
                  >
                    <title>{`Stage ${k + 1}: ${absolute(rows[bar.index].metric, stages[k])} (${Math.round((rows[bar.index][stack.key] as number) * 100)} %)`}</title>
                  </rect>
                )),
              )
            }
          </BarStackHorizontal>
          {rows.map((r) => (
            <text
              key={r.metric}
              x={-8}
              y={(yScale(r.metric) ?? 0) + yScale.bandwidth() / 2}
              textAnchor="end"
              dominantBaseline="middle"
              fontSize={13}
              fill="var(--color-ink)"
            >
              {r.metric}
            </text>
          ))}
          <AxisBottom
            top={rows.length * ROW_HEIGHT}
            scale={xScale}
            numTicks={5}
            tickFormat={(v) => `${Math.round(Number(v) * 100)} %`}
            {...AXIS}
          />
        </Group>
      </svg>
      <figcaption>
        <ul className="flex flex-wrap gap-x-5 gap-y-1 text-note">
          {stages.map((s, k) => (
            <li key={s.index} className="inline-flex items-center gap-1.5">
              <span aria-hidden className="inline-block size-3 rounded-sm" style={{ background: stageColor(k) }} />
              Stage {k + 1}: {formatCount(s.tokens)} tokens, {formatHours(s.acceleratorHours)}
            </li>
          ))}
        </ul>
      </figcaption>
    </figure>
  );
}
