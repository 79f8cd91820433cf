import { useEffect, useMemo, useState, type ReactNode } from "react";
import { useLocation, useNavigate } from "react-router-dom";
import { useQuery } from "@tanstack/react-query";
import type { ModelProfile } from "@shared/schemas/models";
import { Loading, Notice } from "@/components/notice";
import { Panel } from "@/components/page";
import { ExportTargets } from "@/components/export-targets";
import type { ExportRequest } from "@shared/schemas/exports";
import { isApiError } from "@/lib/api-client";
import { analysesQueries } from "@/lib/api/analyses";
import { sig } from "../figures";
import { useDebounced } from "@/lib/use-debounced";
import { withDefaults } from "../state/defaults";
import { layerGroupsOf } from "@shared/layer-groups";
import { GroupPicker, groupShape, pickGroup } from "./group-picker";
import type { WorkbenchInputs as Inputs } from "../state/inputs";
import { toRequest } from "../state/to-request";
import { inputsToParams, parseInputs } from "../state/url-codec";
import { WorkbenchInputs } from "./workbench-inputs";
import { WorkbenchResults } from "./workbench-results";

type WorkbenchProps = {
  profiles: ModelProfile[];
  /** Shown under the inputs for the chosen profile, e.g. the warnings its config import raised. */
  profileNotes?: (profile: ModelProfile) => ReactNode;
};

/** Compare rotary scaling methods on one model, pair by pair. The inputs live in the URL. */
export function Workbench({ profiles, profileNotes }: WorkbenchProps) {
  const location = useLocation();
  const navigate = useNavigate();
  const [inputs, setInputs] = useState<Inputs>(() =>
    withDefaults(parseInputs(new URLSearchParams(location.search)), profiles),
  );

  const search = inputsToParams(inputs).toString();
  useEffect(() => {
    if (search !== location.search.replace(/^\?/, "")) navigate({ search }, { replace: true });
  }, [search, location.search, navigate]);

  const model = inputs.model;
  const chosen = model.kind === "saved" ? (profiles.find((p) => p.id === model.id) ?? null) : null;
  const groups = useMemo(() => (chosen ? layerGroupsOf(chosen) : []), [chosen]);
  const group = pickGroup(groups, model.kind === "saved" ? model.group : undefined);
  const savedShape = useMemo(() => (chosen ? groupShape(chosen, group) : null), [chosen, group]);
  const { request, errors } = useMemo(() => toRequest(inputs, savedShape), [inputs, savedShape]);
  const settled = useDebounced(request, 300, { holdWhileNull: true });
  const analysis = useQuery(analysesQueries.detail(settled));
  // The stacks are compiled for the method on show (the picker above the charts), with the analysed inputs.
  const shownMethod = settled ? settled.methods[Math.min(inputs.view, settled.methods.length - 1)] : null;
  const exportRequest = useMemo<ExportRequest | null>(
    () =>
      settled && shownMethod
        ? { model: settled.model, targetContext: settled.targetContext, method: shownMethod }
        : null,
    [settled, shownMethod],
  );

  const trainedContext =
    chosen?.trainedContext ?? (model.kind === "shape" ? Number(model.trainedContext) || null : null);
  const target = Number(inputs.target);
  const context = {
    scale: trainedContext && target > 0 ? target / trainedContext : null,
    targetContext: target > 0 ? target : null,
    pairs: analysis.data?.model.pairs ?? chosen?.pairs ?? null,
  };
  const serverErrors = analysis.isError && isApiError(analysis.error) ? (analysis.error.fields ?? {}) : {};
  const shownErrors = { ...serverErrors, ...errors };
  const missingProfile = model.kind === "saved" && model.id !== null && !chosen;

  return (
    <div className="flex flex-col gap-6">
      <WorkbenchInputs
        inputs={inputs}
        onChange={setInputs}
        profiles={profiles}
        chosen={chosen}
        trainedContext={trainedContext}
        context={context}
        errors={shownErrors}
        profileNotes={chosen && profileNotes ? profileNotes(chosen) : undefined}
      />
      {chosen && groups.length > 1 && model.kind === "saved" && (
        <GroupPicker
          groups={groups}
          value={group?.kind ?? ""}
          onChange={(kind) => setInputs({ ...inputs, model: { ...model, group: kind } })}
        />
      )}
      {missingProfile && (
        <Notice tone="alert" title="That profile is gone">
          The link names a profile that no longer exists. Pick another.
        </Notice>
      )}
      <div
        className="flex min-h-6 flex-wrap items-center gap-3 text-note text-ink-soft"
        aria-live="polite"
        data-testid="analysis-status"
      >
        {analysis.data && (
          <span>
            d = {analysis.data.model.rotaryDim} ({analysis.data.model.pairs} pairs), b ={" "}
            {sig(analysis.data.model.ropeTheta, 6)}, L = {analysis.data.model.trainedContext} → L′ ={" "}
            {analysis.data.targetContext}, s = {sig(analysis.data.scale, 4)}
          </span>
        )}
        {analysis.isFetching && <span className="animate-pulse">Updating…</span>}
        {request === null && analysis.data && (
          <span className="text-signal">Some inputs need fixing; the figures below are for the last valid ones.</span>
        )}
      </div>
      {analysis.isError && (
        <Notice tone="alert" title="The analysis was refused">
          {analysis.error.message}
        </Notice>
      )}
      {analysis.data ? (
        <WorkbenchResults
          analysis={analysis.data}
          view={inputs.view}
          onView={(view) => setInputs({ ...inputs, view })}
          flaggedOnly={inputs.flaggedOnly}
          onFlaggedOnly={(flaggedOnly) => setInputs({ ...inputs, flaggedOnly })}
        />
      ) : analysis.isFetching ? (
        <Loading label="Computing…" />
      ) : (
        request === null && <p className="text-body text-ink-soft">Fill in the inputs above to see the figures.</p>
      )}
      {analysis.data && (
        <Panel title="Rigging for each stack">
          <ExportTargets request={exportRequest} />
        </Panel>
      )}
    </div>
  );
}
