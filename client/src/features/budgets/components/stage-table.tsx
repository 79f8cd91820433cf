import type { BudgetEstimateResponse, BudgetRecipeResponse } from "@shared/schemas/budget";
import { MAX_BUDGET_STAGES } from "@shared/schemas/budget";
import { Button } from "@/components/button";
import { Chip } from "@/components/notice";
import { formatCount, formatHours, formatMoney } from "@/lib/format";
import { citation, stillAsReported } from "../lib/recipes";
import { emptyStage, type StageDraft } from "../lib/sheet-draft";
import { CellInput } from "./sheet-input";
import { FramedTable } from "@/components/framed-table";

type Props = {
  stages: StageDraft[];
  /** Figures for the rows, by index; may lag the inputs by one request. */
  figures: BudgetEstimateResponse["stages"] | undefined;
  /** The workspace currency of the cost column, once an estimate has said it. */
  currency?: string;
  issues: Record<string, string>;
  recipes: BudgetRecipeResponse[];
  /** Plan mode: the plan owns its rows (no adding or removing; stages are given by steps). */
  fixedRows?: boolean;
  rowLabels?: string[];
  disabled?: boolean;
  onChange: (stages: StageDraft[]) => void;
};

export function StageTable({
  stages,
  figures,
  currency,
  issues,
  recipes,
  fixedRows,
  rowLabels,
  disabled,
  onChange,
}: Props) {
  const update = (i: number, patch: Partial<StageDraft>) =>
    onChange(stages.map((s, k) => (k === i ? { ...s, ...patch } : s)));
  const remove = (i: number) => onChange(stages.filter((_, k) => k !== i));
  const add = () => {
    const last = stages[stages.length - 1];
    onChange([
      ...stages,
      emptyStage({
        sequenceLength: last?.sequenceLength ?? "",
        globalBatch: last?.globalBatch ?? "",
        steps: last?.steps ?? "",
      }),
    ]);
  };
  const issue = (i: number, field: string) => issues[`stages.${i}.${field}`];

  return (
    <div className="flex flex-col gap-3">
      <FramedTable
        caption="Stages"
        head={
          <>
            <th scope="col">Stage</th>
            <th scope="col">Sequence length (tokens)</th>
            <th scope="col">Global batch (sequences)</th>
            <th scope="col">{fixedRows ? "Steps" : "Steps or token target"}</th>
            <th scope="col">Tokens trained</th>
            <th scope="col">Accelerator-hours</th>
            <th scope="col">Cost</th>
            {!fixedRows && (
              <th scope="col">
                <span className="sr-only">Remove</span>
              </th>
            )}
          </>
        }
      >
        {stages.map((s, i) => {
          const name = rowLabels?.[i] ?? `Stage ${i + 1}`;
          const f = figures?.[i];
          const recipe = s.recipeId ? recipes.find((r) => r.id === s.recipeId) : undefined;
          return (
            <tr key={i} className="border-b border-rule/70 align-top last:border-b-0">
              <th scope="row" className="px-2 py-2 text-left font-medium">
                {name}
                {recipe && (
                  <div className="mt-1 max-w-56 text-note font-normal" data-testid={`recipe-label-${i}`}>
                    <Chip tone="seaglass">{stillAsReported(s, recipe) ? "As reported" : "Edited from"}</Chip>{" "}
                    {recipe.name}, {citation(recipe)}: the paper's own run, not a prediction
                  </div>
                )}
              </th>
              <td className="px-2 py-2">
                <CellInput
                  label={`${name} sequence length`}
                  value={s.sequenceLength}
                  onChange={(t) => update(i, { sequenceLength: t })}
                  error={issue(i, "sequenceLength")}
                  disabled={disabled}
                />
              </td>
              <td className="px-2 py-2">
                <CellInput
                  label={`${name} global batch`}
                  value={s.globalBatch}
                  onChange={(t) => update(i, { globalBatch: t })}
                  error={issue(i, "globalBatch")}
                  disabled={disabled}
                />
              </td>
              <td className="px-2 py-2">
                <div className="flex items-start gap-1">
                  {!fixedRows && (
                    <select
                      aria-label={`${name} given by`}
                      value={s.by}
                      disabled={disabled}
                      onChange={(e) => update(i, { by: e.target.value as StageDraft["by"] })}
                      className="rounded-md border border-rule-strong bg-white/70 px-1 py-1 text-note"
                    >
                      <option value="steps">steps</option>
                      <option value="tokens">tokens</option>
                    </select>
                  )}
                  {s.by === "steps" ? (
                    <CellInput
                      label={`${name} steps`}
                      value={s.steps}
                      onChange={(t) => update(i, { steps: t })}
                      error={issue(i, "steps")}
                      disabled={disabled}
                    />
                  ) : (
                    <CellInput
                      label={`${name} token target`}
                      value={s.tokens}
                      onChange={(t) => update(i, { tokens: t })}
                      error={issue(i, "tokens")}
                      disabled={disabled}
                    />
                  )}
                </div>
                {f && s.by === "tokens" && (
                  <p className="mt-1 text-note text-ink-soft">{formatCount(f.steps)} whole steps</p>
                )}
              </td>
              <td className="px-2 py-2 tabular-nums">{f ? formatCount(f.tokens) : "—"}</td>
              <td className="px-2 py-2 tabular-nums">{f ? formatHours(f.acceleratorHours) : "—"}</td>
              <td className="px-2 py-2 tabular-nums">{f ? formatMoney(f.cost, currency) : "—"}</td>
              {!fixedRows && (
                <td className="px-2 py-2">
                  <Button
                    variant="quiet"
                    size="sm"
                    onClick={() => remove(i)}
                    disabled={disabled || stages.length <= 1}
                    aria-label={`Remove ${name}`}
                  >
                    Remove
                  </Button>
                </td>
              )}
            </tr>
          );
        })}
      </FramedTable>
      {!fixedRows && (
        <div>
          <Button variant="secondary" size="sm" onClick={add} disabled={disabled || stages.length >= MAX_BUDGET_STAGES}>
            Add a stage
          </Button>
        </div>
      )}
    </div>
  );
}
