import type { ReactNode } from "react";
import { useQuery } from "@tanstack/react-query";
import type { Accelerator, BudgetRecipeResponse } from "@shared/schemas/budget";
import { Button } from "@/components/button";
import { Loading, Notice } from "@/components/notice";
import { Panel } from "@/components/page";
import { isApiError } from "@/lib/api-client";
import { downloadText } from "@/lib/download";
import { useBudgetEstimate } from "../api/estimate";
import { recipesQuery } from "../api/get-recipes";
import { clusterLabel } from "../lib/cluster-label";
import { stagesCsv } from "../lib/csv";
import { recipeStageDraft } from "../lib/recipes";
import { buildRequest, type SheetContext, type SheetDraft } from "../lib/sheet-draft";
import { ClusterSettings } from "./cluster-settings";
import { EstimateFigures } from "./estimate-figures";
import { RecipeMenu } from "./recipe-menu";
import { StageTable } from "./stage-table";
import { parseNumberText } from "@/lib/number-text";

export type BudgetSheetProps = {
  /** "plan": the rows are the plan's stages (edit lengths, batches and steps; no adding or removing). */
  mode: "estimator" | "plan";
  value: SheetDraft;
  onChange: (next: SheetDraft) => void;
  /** The model and growth-curve ends; null while no model is chosen. */
  context: SheetContext | null;
  accelerators: Accelerator[];
  rowLabels?: string[];
  /** Field messages from elsewhere (a refused save), keyed like the request: "stages.0.steps", "contextParallel". */
  extraIssues?: Record<string, string>;
  /** Controls under the cluster settings: the plan's save button. */
  actions?: ReactNode;
  disabled?: boolean;
  csvName?: string;
  /** The estimator's model choice, shown first and given the issues that name "model.…". */
  modelPanel?: (issues: Record<string, string>) => ReactNode;
};

/** The budget sheet: inputs on the left of the story, figures recomputed by the server as they change. */
export function BudgetSheet({
  mode,
  value,
  onChange,
  context,
  accelerators,
  rowLabels,
  extraIssues = {},
  actions,
  disabled,
  csvName = "ropewalk-budget.csv",
  modelPanel,
}: BudgetSheetProps) {
  const recipes = useQuery(recipesQuery());
  const built = context ? buildRequest(value, context) : { request: null, issues: {} };
  const { query: estimate, settling } = useBudgetEstimate(built.request);
  const serverIssues = isApiError(estimate.error) ? (estimate.error.fields ?? {}) : {};
  const issues = { ...serverIssues, ...built.issues, ...extraIssues };
  // With inputs not yet valid the last figures stay, dimmed, so the page does not jump while someone types.
  const data = context ? estimate.data : undefined;
  const stale = !built.request || settling || estimate.isPlaceholderData || estimate.isFetching;

  const pickRecipe = (recipe: BudgetRecipeResponse, target: number | null) => {
    if (target === null) {
      const lengths = value.stages.map((s) => parseNumberText(s.sequenceLength) ?? 0);
      const targetLength = context?.targetContext ?? Math.max(4096, ...lengths);
      const batch = parseNumberText(value.stages[value.stages.length - 1]?.globalBatch ?? "") ?? 64;
      onChange({ ...value, stages: [...value.stages, recipeStageDraft(recipe, targetLength, batch)] });
      return;
    }
    const row = value.stages[target];
    const next = recipeStageDraft(
      recipe,
      parseNumberText(row.sequenceLength) ?? 4096,
      parseNumberText(row.globalBatch) ?? 64,
      true,
    );
    onChange({ ...value, stages: value.stages.map((s, k) => (k === target ? next : s)) });
  };

  const names = rowLabels ?? value.stages.map((_, i) => `Stage ${i + 1}`);
  return (
    <div className="flex flex-col gap-5" data-testid="budget-sheet">
      {modelPanel && <Panel title="Model">{modelPanel(issues)}</Panel>}
      <Panel title="Cluster and conventions">
        <ClusterSettings
          cluster={value.cluster}
          settings={value.settings}
          accelerators={accelerators}
          assumptions={data?.assumptions}
          currency={data?.currency}
          issues={issues}
          disabled={disabled}
          onCluster={(cluster) => onChange({ ...value, cluster })}
          onSettings={(settings) => onChange({ ...value, settings })}
        />
        {actions && <div className="mt-4 border-t border-rule pt-4">{actions}</div>}
      </Panel>

      <Panel title="Stages">
        <div className="flex flex-col gap-3">
          <StageTable
            stages={value.stages}
            figures={data?.stages}
            currency={data?.currency}
            issues={issues}
            recipes={recipes.data?.recipes ?? []}
            fixedRows={mode === "plan"}
            rowLabels={rowLabels}
            disabled={disabled}
            onChange={(stages) => onChange({ ...value, stages })}
          />
          {recipes.data && !disabled && (
            <RecipeMenu
              recipes={recipes.data.recipes}
              caution={recipes.data.caution}
              targets={mode === "plan" ? names : undefined}
              onPick={pickRecipe}
            />
          )}
        </div>
      </Panel>

      <Panel
        title="Figures"
        aside={
          stale && data ? (
            <span className="text-note text-ink-soft" role="status">
              Recomputing…
            </span>
          ) : undefined
        }
      >
        {!context && (
          <Notice>
            {mode === "plan"
              ? "Pick the model this plan extends to see figures."
              : "Pick a model profile or type a model shape to see figures."}
          </Notice>
        )}
        {context && !built.request && (
          <Notice tone="alert" title="Some inputs need fixing">
            The marked inputs are not valid yet; the figures wait for them.
          </Notice>
        )}
        {estimate.error && !isApiError(estimate.error) && <Notice tone="alert">Could not compute the budget.</Notice>}
        {isApiError(estimate.error) && built.request && (
          <Notice tone="alert" title="The server refused these inputs">
            {estimate.error.message}
          </Notice>
        )}
        {built.request && !data && estimate.isFetching && <Loading label="Computing the budget…" />}
        {data && (
          <EstimateFigures
            estimate={data}
            memoryBytes={data.resolved.cluster.memoryBytes}
            accelerators={parseNumberText(value.settings.accelerators) ?? 0}
            stale={stale}
            actions={
              <div>
                <Button
                  variant="secondary"
                  size="sm"
                  onClick={() =>
                    downloadText(
                      stagesCsv(data, clusterLabel(data.resolved.acceleratorName, data.resolved.cluster)),
                      csvName,
                    )
                  }
                >
                  Download the stage table (CSV)
                </Button>
              </div>
            }
          />
        )}
      </Panel>
    </div>
  );
}
