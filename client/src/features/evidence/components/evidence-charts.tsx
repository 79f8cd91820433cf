import type { EvidenceList } from "@shared/schemas/evidence-api";
import { benchmarkPairs, perplexityPoints, retrievalGrid, taskSeries } from "../lib/chart-data";
import { PerplexityChart } from "../charts/perplexity-chart";
import { RegressionChart } from "../charts/regression-chart";
import { RetrievalHeatmap } from "../charts/retrieval-heatmap";
import { TaskChart } from "../charts/task-chart";

/** The charts the uploaded kinds call for; a kind with no upload draws nothing. */
export function EvidenceCharts({ data }: { data: EvidenceList }) {
  const { evidence, trainedContext, targetContext, criteria } = data;
  const passkey = retrievalGrid(evidence, "passkey");
  const needle = retrievalGrid(evidence, "needle");
  const perplexity = perplexityPoints(evidence);
  const tasks = taskSeries(evidence);
  const pairs = benchmarkPairs(evidence);
  const ruler = criteria.find((c) => c.kind === "ruler");
  const regression = criteria.find((c) => c.kind === "short_regression");
  const any = passkey.cells.length + needle.cells.length + perplexity.length + tasks.mean.length + pairs.length;
  if (!any) return null;
  return (
    <div className="grid min-w-0 gap-6 xl:grid-cols-2">
      {passkey.cells.length > 0 && (
        <RetrievalHeatmap grid={passkey} kind="passkey" trainedContext={trainedContext} targetContext={targetContext} />
      )}
      {needle.cells.length > 0 && (
        <RetrievalHeatmap grid={needle} kind="needle" trainedContext={trainedContext} targetContext={targetContext} />
      )}
      {perplexity.length > 0 && (
        <PerplexityChart points={perplexity} trainedContext={trainedContext} targetContext={targetContext} />
      )}
      {tasks.mean.length > 0 && (
        <TaskChart
          tasks={tasks.tasks}
          mean={tasks.mean}
          threshold={ruler?.threshold ?? null}
          effectiveLength={ruler?.effectiveLength ?? null}
          targetContext={targetContext}
        />
      )}
      {pairs.length > 0 && <RegressionChart pairs={pairs} delta={regression?.threshold ?? null} />}
    </div>
  );
}
