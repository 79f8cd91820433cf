import { useQuery } from "@tanstack/react-query";
import type { RevisionContent } from "@shared/schemas/plans";
import { Loading, Notice } from "@/components/notice";
import { analysesQueries } from "@/lib/api/analyses";
import { analysisRequestOf } from "@/features/plans/lib/model-shape";
import { DecayChart } from "@/features/workbench/charts/decay-chart";
import { RatioChart } from "@/features/workbench/charts/ratio-chart";
import { SpectrumChart } from "@/features/workbench/charts/spectrum-chart";

/** The workbench's charts for one revision. Figures are recomputed for display; the stored results above are what was signed. */
export function RevisionCharts({ content }: { content: RevisionContent }) {
  const analysis = useQuery(analysesQueries.detail(analysisRequestOf(content)));
  if (analysis.isPending) return <Loading label="Running the engine…" />;
  if (analysis.isError)
    return (
      <Notice tone="alert" title="Could not draw the charts">
        {analysis.error.message}
      </Notice>
    );
  const a = analysis.data;
  const differs = a.engineVersion !== content.engineVersion;
  return (
    <div className="flex flex-col gap-6" data-testid="revision-charts">
      {differs && (
        <Notice title="Drawn with a newer engine">
          This revision was computed with {content.engineVersion}; the charts use {a.engineVersion}. The signed figures
          are the stored ones in the tables.
        </Notice>
      )}
      <figure className="flex flex-col gap-2">
        <figcaption className="text-body font-semibold">Wavelength of each pair, before and after rescaling</figcaption>
        <SpectrumChart
          analysis={a}
          methodIndex={0}
          sections={
            content.model.mropeSection
              ? { section: content.model.mropeSection, interleaved: content.model.mropeInterleaved === true }
              : null
          }
        />
      </figure>
      <figure className="flex flex-col gap-2">
        <figcaption className="text-body font-semibold">How much each pair is slowed (θ′/θ)</figcaption>
        <RatioChart analysis={a} />
      </figure>
      <figure className="flex flex-col gap-2">
        <figcaption className="text-body font-semibold">Long-term decay with relative distance</figcaption>
        <DecayChart analysis={a} />
      </figure>
    </div>
  );
}
