import { AxisBottom, AxisLeft } from "@visx/axis";
import { GridRows } from "@visx/grid";
import { Group } from "@visx/group";
import { scaleBand, scaleLinear } from "@visx/scale";
import type { BenchmarkPair } from "../lib/chart-data";
import { AXIS } from "@/components/chart-axis";
import { BASELINE, ChartFrame, TUNED, isNarrow } from "./chart-frame";

const HEIGHT = 260;

/** A bar pair per short-context benchmark: the base model's score beside the tuned model's. */
export function RegressionChart({ pairs, delta }: { pairs: BenchmarkPair[]; delta: number | null }) {
  return (
    <ChartFrame
      title="Short-context scores, base against tuned"
      caption={`Each benchmark's score for the base model and the tuned one${delta !== null ? `; the tuned bar may sit at most ${delta} below the base` : ""}.`}
      testId="chart-regression"
      height={HEIGHT}
      legend={
        <>
          <span className="inline-flex items-center gap-1.5">
            <span className="size-3 rounded-sm" style={{ background: BASELINE }} /> base model
          </span>
          <span className="inline-flex items-center gap-1.5">
            <span className="size-3 rounded-sm" style={{ background: TUNED }} /> tuned model
          </span>
        </>
      }
    >
      {(width) => {
        const narrow = isNarrow(width);
        const margin = { top: 12, right: 8, bottom: 40, left: narrow ? 36 : 44 };
        const innerW = Math.max(40, width - margin.left - margin.right);
        const innerH = HEIGHT - margin.top - margin.bottom;
        const x = scaleBand<string>({ domain: pairs.map((p) => p.benchmark), range: [0, innerW], padding: 0.25 });
        const side = scaleBand<string>({ domain: ["baseline", "tuned"], range: [0, x.bandwidth()], padding: 0.08 });
        const top = Math.max(...pairs.flatMap((p) => [p.baseline, p.tuned]), 0);
        const y = scaleLinear<number>({ domain: [0, top <= 1 ? 1 : top * 1.08], range: [innerH, 0], nice: true });
        return (
          <svg width={width} height={HEIGHT} role="img" aria-label={`Scores of ${pairs.length} benchmarks`}>
            <Group top={margin.top} left={margin.left}>
              <GridRows scale={y} width={innerW} numTicks={4} stroke="var(--color-rule)" />
              {pairs.map((p) => (
                <g key={p.benchmark} transform={`translate(${x(p.benchmark) ?? 0},0)`} data-benchmark={p.benchmark}>
                  {(["baseline", "tuned"] as const).map((which) => (
                    <rect
                      key={which}
                      x={side(which)}
                      y={y(p[which])}
                      width={side.bandwidth()}
                      height={Math.max(0, innerH - y(p[which]))}
                      fill={which === "baseline" ? BASELINE : TUNED}
                    >
                      <title>{`${p.benchmark}, ${which === "baseline" ? "base" : "tuned"}: ${p[which]}`}</title>
                    </rect>
                  ))}
                </g>
              ))}
              <AxisLeft scale={y} numTicks={4} {...AXIS} />
              <AxisBottom top={innerH} scale={x} {...AXIS} />
            </Group>
          </svg>
        );
      }}
    </ChartFrame>
  );
}
