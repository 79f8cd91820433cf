import { AxisLeft } from "@visx/axis";
import { GridRows } from "@visx/grid";
import { Group } from "@visx/group";
import { scaleLinear } from "@visx/scale";
import { Line, LinePath } from "@visx/shape";
import type { Point, TaskSeries } from "../lib/chart-data";
import { AXIS } from "@/components/chart-axis";
import { ChartFrame, Key, SIGNAL, TARGET, TUNED, isNarrow, lengthLabel } from "./chart-frame";
import { LengthAxis, LengthMarker, lengthScale } from "./length-axis";

const HEIGHT = 280;
const TASK_COLOURS = ["#c48a4d", "#6a4c93", "#3b6ea8", "#8c7a1e", "#a3476f", "#4f7d3a", "#7a4614"];

type TaskChartProps = {
  tasks: TaskSeries[];
  mean: Point[];
  /** the ruler criterion's threshold, drawn across the chart */
  threshold: number | null;
  /** the longest length up to which the mean stays at or above the threshold (the server's verdict), or null */
  effectiveLength: number | null;
  targetContext: number;
};

/** Task scores per length, their mean, the criterion's threshold and the effective length it gives. */
export function TaskChart({ tasks, mean, threshold, effectiveLength, targetContext }: TaskChartProps) {
  return (
    <ChartFrame
      title="Task scores by length"
      caption="Each synthetic task's score (0 to 1) per length; the thick line is their mean, which the criterion compares."
      testId="chart-tasks"
      height={HEIGHT}
      legend={
        <>
          <Key colour={TUNED} label="mean of tasks" />
          {tasks.map((t, i) => (
            <Key key={t.task} colour={TASK_COLOURS[i % TASK_COLOURS.length]!} label={t.task} />
          ))}
          {threshold !== null && <Key colour={SIGNAL} label={`threshold ${threshold}`} dashed />}
          {effectiveLength !== null && (
            <Key colour={TARGET} label={`effective length ${lengthLabel(effectiveLength)}`} />
          )}
        </>
      }
    >
      {(width) => {
        const narrow = isNarrow(width);
        const margin = { top: 16, right: 12, bottom: 40, left: narrow ? 34 : 44 };
        const innerW = Math.max(40, width - margin.left - margin.right);
        const innerH = HEIGHT - margin.top - margin.bottom;
        const x = lengthScale([...mean.map((p) => p.x), targetContext], innerW);
        const y = scaleLinear<number>({ domain: [0, 1], range: [innerH, 0] });
        return (
          <svg width={width} height={HEIGHT} role="img" aria-label={`Scores of ${tasks.length} tasks by length`}>
            <Group top={margin.top} left={margin.left}>
              <GridRows scale={y} width={innerW} numTicks={5} stroke="var(--color-rule)" />
              {tasks.map((t, i) => (
                <LinePath
                  key={t.task}
                  data={t.points}
                  x={(p) => x(p.x)}
                  y={(p) => y(p.y)}
                  stroke={TASK_COLOURS[i % TASK_COLOURS.length]}
                  strokeWidth={1.25}
                />
              ))}
              <LinePath data={mean} x={(p) => x(p.x)} y={(p) => y(p.y)} stroke={TUNED} strokeWidth={3} />
              {mean.map((p) => (
                <circle key={p.x} cx={x(p.x)} cy={y(p.y)} r={3.5} fill={TUNED}>
                  <title>{`${lengthLabel(p.x)} tokens: mean score ${p.y.toFixed(3)}`}</title>
                </circle>
              ))}
              {threshold !== null && (
                <Line
                  from={{ x: 0, y: y(threshold) }}
                  to={{ x: innerW, y: y(threshold) }}
                  stroke={SIGNAL}
                  strokeDasharray="5 3"
                />
              )}
              {effectiveLength !== null && (
                <LengthMarker x={x(effectiveLength)} height={innerH} colour={TARGET} label="effective" anchor="end" />
              )}
              <AxisLeft scale={y} numTicks={5} {...AXIS} />
              <LengthAxis scale={x} top={innerH} maxTicks={narrow ? 4 : 8} />
            </Group>
          </svg>
        );
      }}
    </ChartFrame>
  );
}
