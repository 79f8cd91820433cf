import { AxisLeft } from "@visx/axis";
import { GridRows } from "@visx/grid";
import { Group } from "@visx/group";
import { scaleLinear } from "@visx/scale";
import { LinePath } from "@visx/shape";
import type { Point } from "../lib/chart-data";
import { AXIS } from "@/components/chart-axis";
import { ChartFrame, Key, TARGET, TRAINED, TUNED, isNarrow, lengthLabel } from "./chart-frame";
import { LengthAxis, LengthMarker, lengthScale } from "./length-axis";

const HEIGHT = 260;

/** Perplexity against length on a log axis; a curve that climbs past the trained length is the tell of a failed extension. */
export function PerplexityChart({
  points,
  trainedContext,
  targetContext,
}: {
  points: Point[];
  trainedContext: number;
  targetContext: number;
}) {
  return (
    <ChartFrame
      title="Perplexity by length"
      caption="Held-out perplexity at each measured length (lower is better). Low perplexity alone does not show that retrieval works."
      testId="chart-perplexity"
      height={HEIGHT}
      legend={
        <>
          <Key colour={TUNED} label="perplexity" />
          <Key colour={TRAINED} label={`trained ${lengthLabel(trainedContext)}`} dashed />
          <Key colour={TARGET} label={`target ${lengthLabel(targetContext)}`} />
        </>
      }
    >
      {(width) => {
        const narrow = isNarrow(width);
        const margin = { top: 16, right: 12, bottom: 40, left: narrow ? 36 : 48 };
        const innerW = Math.max(40, width - margin.left - margin.right);
        const innerH = HEIGHT - margin.top - margin.bottom;
        const x = lengthScale([...points.map((p) => p.x), trainedContext, targetContext], innerW);
        const ys = points.map((p) => p.y);
        const y = scaleLinear<number>({
          domain: [Math.max(1, Math.min(...ys) * 0.9), Math.max(...ys) * 1.08],
          range: [innerH, 0],
          nice: true,
        });
        return (
          <svg width={width} height={HEIGHT} role="img" aria-label={`Perplexity at ${points.length} lengths`}>
            <Group top={margin.top} left={margin.left}>
              <GridRows scale={y} width={innerW} numTicks={4} stroke="var(--color-rule)" />
              <LengthMarker
                x={x(trainedContext)}
                height={innerH}
                colour={TRAINED}
                label="trained"
                dashed
                anchor="end"
              />
              <LengthMarker x={x(targetContext)} height={innerH} colour={TARGET} label="target" />
              <LinePath data={points} x={(p) => x(p.x)} y={(p) => y(p.y)} stroke={TUNED} strokeWidth={2} />
              {points.map((p) => (
                <circle key={p.x} cx={x(p.x)} cy={y(p.y)} r={3.5} fill={TUNED}>
                  <title>{`${lengthLabel(p.x)} tokens: perplexity ${p.y}`}</title>
                </circle>
              ))}
              <AxisLeft scale={y} numTicks={4} {...AXIS} />
              <LengthAxis scale={x} top={innerH} maxTicks={narrow ? 4 : 8} />
            </Group>
          </svg>
        );
      }}
    </ChartFrame>
  );
}
