import { useEffect, useMemo, useState, type ReactNode } from "react";
import { useLocation, useNavigate } from "react-router-dom";
import { useQuery } from "@tanstack/react-query";
import type { ModelProfile } from "@shared/schemas/models";
import { Loading, Notice } from "@/components/notice";
import { Panel } from "@/components/page";
import { ExportTargets } from "@/components/export-targets";
import type { ExportRequest } from "@shared/schemas/exports";
import type { AnalysisRequest } from "@shared/schemas/analysis";
import { isApiError } from "@/lib/api-client";
import { analysesQueries } from "@/lib/api/analyses";
import { useDebounced } from "@/lib/use-debounced";
import { withDefaults } from "../state/defaults";
import { layerGroupsOf, scaledGroupIndex } from "@shared/layer-groups";
import { groupShape } from "@shared/profile-shapes";
import { GroupPicker, pickGroup } from "./group-picker";
import type { WorkbenchInputs as Inputs } from "../state/inputs";
import { toRequest } from "../state/to-request";
import { inputsToParams, parseInputs } from "../state/url-codec";
import { WorkbenchInputs } from "./workbench-inputs";
import { WorkbenchResults } from "./workbench-results";
import { methodLabels } from "../state/method-labels";
import { shippedMethod } from "@shared/lineage";
import { describeAnalysis, StaleBanner, staleness, type Answered } from "./stale-results";

/** The saved profile an analysed request named, if it named one (a layer group or a typed shape is sent as a shape). */
function profileNameOf({ model }: AnalysisRequest, profiles: ModelProfile[]): string | null {
  return "modelId" in model ? (profiles.find((p) => p.id === model.modelId)?.name ?? null) : null;
}

type WorkbenchProps = {
  profiles: ModelProfile[];
  /** Shown under the inputs for the chosen profile, e.g. the warnings its config import raised. */
  profileNotes?: (profile: ModelProfile) => ReactNode;
  /** The search box that narrows `profiles` (the server pages them). */
  profileSearch?: ReactNode;
};

/** Compare rotary scaling methods on one model, pair by pair. The inputs live in the URL. */
export function Workbench({ profiles, profileNotes, profileSearch }: WorkbenchProps) {
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
  // The figures on screen and the request that produced them, kept together: while new inputs are invalid or still
  // computing, the last answer stays, labelled by its own request and marked stale (never by the current rows).
  const [answered, setAnswered] = useState<Answered | null>(null);
  if (analysis.data && !analysis.isPlaceholderData && settled && answered?.response !== analysis.data)
    setAnswered({ request: settled, response: analysis.data });
  const stale = staleness(answered, request, analysis.isError);
  // The stacks are compiled for the method on show (the picker above the charts), with the analysed inputs.
  const shownMethod = answered
    ? answered.request.methods[Math.min(inputs.view, answered.request.methods.length - 1)]
    : null;
  // A layered profile analysed on the group plans scale compiles like a plan: every other group as trained, and the
  // matrix and fingerprint cover them all. Another group on show is compiled on its own.
  const layered = groups.length > 1 && group === groups[scaledGroupIndex(groups)] ? groups : undefined;
  const exportRequest = useMemo<ExportRequest | null>(
    () =>
      answered && shownMethod
        ? {
            model: answered.request.model,
            targetContext: answered.request.targetContext,
            method: shownMethod,
            ...(layered ? { layerGroups: layered } : {}),
          }
        : null,
    [answered, shownMethod, layered],
  );

  const trainedContext =
    chosen?.trainedContext ?? (model.kind === "shape" ? Number(model.trainedContext) || null : null);
  const target = Number(inputs.target);
  const context = {
    scale: trainedContext && target > 0 ? target / trainedContext : null,
    targetContext: target > 0 ? target : null,
    pairs: answered?.response.model.pairs ?? chosen?.pairs ?? null,
  };
  const serverErrors = analysis.isError && isApiError(analysis.error) ? (analysis.error.fields ?? {}) : {};
  const shownErrors = { ...serverErrors, ...errors };
  const missingProfile = model.kind === "saved" && model.id !== null && !chosen;

  return (
    // Wide screens: the inputs in a sticky side panel (scrolling on their own), the figures beside them.
    <div className="flex flex-col gap-6 xl:grid xl:grid-cols-[24rem_minmax(0,1fr)] xl:items-start">
      <aside
        className="flex min-w-0 flex-col gap-4 xl:sticky xl:top-4 xl:max-h-[calc(100vh-2rem)] xl:overflow-y-auto xl:pr-1"
        aria-label="Workbench inputs"
        data-testid="workbench-inputs"
      >
        <WorkbenchInputs
          inputs={inputs}
          onChange={setInputs}
          profiles={profiles}
          profileSearch={profileSearch}
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
      </aside>
      <div className="flex min-w-0 flex-col gap-6">
        <div
          className="flex min-h-6 flex-wrap items-center gap-3 text-note text-ink-soft"
          aria-live="polite"
          data-testid="analysis-status"
        >
          {answered && <span>{describeAnalysis(answered.response)}</span>}
          {analysis.isFetching && <span className="animate-pulse">Updating…</span>}
        </div>
        {analysis.isError && (
          <Notice tone="alert" title="The analysis was refused">
            {analysis.error.message}
          </Notice>
        )}
        {answered ? (
          <div className="flex flex-col gap-4" data-testid="workbench-results" data-stale={stale ?? undefined}>
            {stale && <StaleBanner kind={stale} response={answered.response} />}
            <div
              className={`flex flex-col gap-6 transition-opacity ${stale ? "opacity-55" : ""}`}
              data-testid="stale-figures"
            >
              <WorkbenchResults
                analysis={answered.response}
                view={inputs.view}
                onView={(view) => setInputs({ ...inputs, view })}
                flaggedOnly={inputs.flaggedOnly}
                onFlaggedOnly={(flaggedOnly) => setInputs({ ...inputs, flaggedOnly })}
                currentMethods={stale ? inputs.methods.map((r) => r.method) : null}
                profile={profileNameOf(answered.request, profiles)}
                labels={methodLabels(
                  answered.request.methods,
                  // offered (and so named) only for the whole profile, as the inputs offer the row
                  model.kind === "saved" && !model.group ? shippedMethod(chosen?.currentScaling) : null,
                )}
                sections={
                  chosen?.mropeSection?.length
                    ? { section: chosen.mropeSection, interleaved: chosen.mropeInterleaved }
                    : null
                }
              />
              <Panel title="Rigging for each stack">
                <ExportTargets request={exportRequest} />
              </Panel>
            </div>
          </div>
        ) : analysis.isFetching ? (
          <Loading label="Computing…" />
        ) : (
          request === null && <p className="text-body text-ink-soft">Fill in the inputs to see the figures.</p>
        )}
      </div>
    </div>
  );
}
