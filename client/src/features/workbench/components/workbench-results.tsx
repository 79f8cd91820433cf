import type { AnalysisResponse, MethodId } from "@shared/schemas/analysis";
import { Notice } from "@/components/notice";
import { Panel } from "@/components/page";
import { DecayChart } from "../charts/decay-chart";
import { RatioChart } from "../charts/ratio-chart";
import { SpectrumChart } from "../charts/spectrum-chart";
import type { Sections } from "../charts/mrope-strip";
import { CAUTION } from "../explain/topics";
import { HowComputed } from "../explain/how-computed";
import { METHOD_LABELS } from "../state/method-fields";
import { BoundsPanel } from "./bounds-panel";
import { MethodSummaries } from "./method-summaries";
import { PairTable } from "./pair-table";
import { SelectField } from "@/components/field";

type ResultsProps = {
  analysis: AnalysisResponse;
  view: number;
  onView: (view: number) => void;
  flaggedOnly: boolean;
  onFlaggedOnly: (value: boolean) => void;
  /** While the figures are stale: the methods the rows ask for now, so a card can say its row has moved on. */
  currentMethods?: MethodId[] | null;
  /** The saved profile the analysis named (for the CSV header), null for a typed-in shape. */
  profile?: string | null;
  /** the profile's multimodal sections, drawn as bands over the pair axis */
  sections?: Sections | null;
  /** what each analysed method is called (state/method-labels.ts); the method's name when absent */
  labels?: string[];
};

function MethodPicker({
  analysis,
  view,
  onView,
  labels,
}: Pick<ResultsProps, "analysis" | "view" | "onView" | "labels">) {
  return (
    <div className="w-72">
      <SelectField label="Method shown" value={String(view)} onChange={(e) => onView(Number(e.target.value))}>
        {analysis.methods.map((m, i) => (
          <option key={i} value={i}>
            {i + 1}. {labels?.[i] ?? METHOD_LABELS[m.method]}
          </option>
        ))}
      </SelectField>
    </div>
  );
}

/** The figures for one analysis; every panel has its explanation one click away. */
export function WorkbenchResults({
  analysis,
  view,
  onView,
  flaggedOnly,
  onFlaggedOnly,
  currentMethods = null,
  profile = null,
  sections = null,
  labels,
}: ResultsProps) {
  const shown = Math.min(view, analysis.methods.length - 1);
  const methods = analysis.methods.map((m) => m.method);
  return (
    <div className="flex flex-col gap-6">
      <Panel
        title="Wavelength per pair"
        aside={<MethodPicker analysis={analysis} view={shown} onView={onView} labels={labels} />}
      >
        <div className="flex flex-col gap-3">
          <SpectrumChart analysis={analysis} methodIndex={shown} sections={sections} labels={labels} />
          <HowComputed
            topics={["wavelength", "rotations", "bands", "flags"]}
            methods={[analysis.methods[shown].method]}
          />
        </div>
      </Panel>
      <div className="grid gap-6 2xl:grid-cols-2 [&>*]:min-w-0">
        <Panel title="Scale ratio θ′/θ per pair">
          <div className="flex flex-col gap-3">
            <RatioChart analysis={analysis} labels={labels} />
            <HowComputed topics={["ratio"]} methods={methods} />
          </div>
        </Panel>
        <Panel title="Long-term decay R(m)">
          <div className="flex flex-col gap-3">
            <DecayChart analysis={analysis} labels={labels} />
            <HowComputed topics={["decay"]} />
          </div>
        </Panel>
      </div>
      <Panel title="Base bounds">
        <BoundsPanel analysis={analysis} />
      </Panel>
      <Panel
        title="Pair by pair"
        aside={<MethodPicker analysis={analysis} view={shown} onView={onView} labels={labels} />}
      >
        <div className="flex flex-col gap-3">
          <PairTable
            analysis={analysis}
            methodIndex={shown}
            profile={profile}
            flaggedOnly={flaggedOnly}
            onFlaggedOnly={onFlaggedOnly}
          />
          <HowComputed topics={["wavelength", "rotations", "bands", "flags", "ratio"]} />
        </div>
      </Panel>
      <Panel title="Methods and their config keys">
        <MethodSummaries analysis={analysis} currentMethods={currentMethods} />
      </Panel>
      <Notice tone="info" title="Estimates, not a verdict">
        {CAUTION} Engine {analysis.engineVersion}.
      </Notice>
    </div>
  );
}
