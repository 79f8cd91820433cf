import { useState } from "react";
import { get, useFormContext, useWatch, type FieldErrors } from "react-hook-form";
import type { Accelerator } from "@shared/schemas/budget";
import type { ModelSnapshot } from "@shared/schemas/plans";
import type { RevisionInput } from "@shared/schemas/plans";
import {
  draftFromPlanBudget,
  PLAN_STAGE_FIELDS,
  planBudgetFromDraft,
  stageDraftsFromPlan,
  type PlanStageNumbers,
} from "../lib/plan-draft";
import { type SheetDraft, type StageDraft } from "../lib/sheet-draft";
import { BudgetSheet } from "./budget-sheet";
import { parseNumberText } from "@/lib/number-text";
import { budgetShapeOf } from "@shared/profile-shapes";
import { planBudgetContexts } from "@shared/plan-budget";

type PlanForm = { revision: RevisionInput; modelId?: number };
/** The model fields the budget uses: a revision's frozen snapshot, or a profile. */
export type PlanModelShape = Pick<
  ModelSnapshot,
  | "parameters"
  | "layers"
  | "attentionHeads"
  | "kvHeads"
  | "headDim"
  | "hiddenSize"
  | "bytesPerElement"
  | "trainedContext"
>;
type Props = {
  /** The revision's model; or `models`, from which the form's own `modelId` picks (the new-plan form). */
  model?: PlanModelShape;
  models?: (PlanModelShape & { id: number })[];
  accelerators: Accelerator[];
  disabled?: boolean;
};

/** Form errors under `prefix` as flat "a.b.c" keys, renamed for the sheet (budget fields drop their prefix). */
function flatErrors(
  errors: FieldErrors,
  prefix: string,
  rename: (key: string) => string,
  out: Record<string, string> = {},
) {
  const node = get(errors, prefix) as Record<string, unknown> | undefined;
  const walk = (value: unknown, path: string) => {
    if (!value || typeof value !== "object") return;
    const message = (value as { message?: unknown }).message;
    if (typeof message === "string" && path) out[rename(path)] = message;
    for (const [k, v] of Object.entries(value))
      if (k !== "ref" && k !== "message" && k !== "type") walk(v, path ? `${path}.${k}` : k);
  };
  walk(node, "");
  return out;
}

/**
 * The budget sheet inside a plan draft editor (react-hook-form context with the revision under `revision`).
 * The rows are the plan's stages: lengths, batches and steps typed here are the plan's own fields. Cluster and
 * settings become `revision.budget`, saved with the draft by the editor's own save (with the version it read).
 */
export function PlanBudgetSheet({ model: given, models, accelerators, disabled }: Props) {
  const { control, setValue, getValues, formState } = useFormContext<PlanForm>();
  const modelId = useWatch({ control, name: "modelId" });
  const model = given ?? models?.find((m) => m.id === modelId);
  const stages = (useWatch({ control, name: "revision.stages" }) ?? []) as PlanStageNumbers[];
  const target = useWatch({ control, name: "revision.targetContext" }) as number | undefined;
  const [settings, setSettings] = useState(() => draftFromPlanBudget(getValues("revision.budget")));
  const [typed, setTyped] = useState<Record<string, string>>({});
  const [recipes, setRecipes] = useState<(StageDraft["recipeId"] | undefined)[]>([]);

  const value: SheetDraft = { ...settings, stages: stageDraftsFromPlan(stages, typed, recipes) };
  const onChange = (next: SheetDraft) => {
    if (next.cluster !== value.cluster || next.settings !== value.settings) {
      setSettings({ cluster: next.cluster, settings: next.settings });
      setValue("revision.budget", planBudgetFromDraft(next), { shouldDirty: true });
    }
    const changedTyping: Record<string, string> = {};
    next.stages.forEach((s, i) => {
      for (const field of PLAN_STAGE_FIELDS) {
        if (s[field] === value.stages[i]?.[field]) continue;
        changedTyping[`${i}.${field}`] = s[field];
        setValue(`revision.stages.${i}.${field}`, parseNumberText(s[field]) as number, { shouldDirty: true });
      }
    });
    if (Object.keys(changedTyping).length) setTyped((t) => ({ ...t, ...changedTyping }));
    setRecipes(next.stages.map((s) => s.recipeId));
  };

  // The same lengths the server costs the plan between when it freezes the revision (shared/plan-budget.ts).
  const context = model && {
    model: budgetShapeOf(model),
    ...planBudgetContexts(
      model.trainedContext,
      target,
      stages.map((s) => s.sequenceLength),
    ),
  };
  const issues = {
    ...flatErrors(formState.errors, "revision.budget", (k) => k),
    ...flatErrors(formState.errors, "revision.stages", (k) => `stages.${k}`),
  };

  const sheet = (
    <BudgetSheet
      mode="plan"
      value={value}
      onChange={onChange}
      context={context ?? null}
      accelerators={accelerators}
      rowLabels={stages.map((_, i) => `Stage ${i + 1}`)}
      extraIssues={issues}
      disabled={disabled}
      csvName="ropewalk-plan-budget.csv"
      actions={
        <p className="text-note text-ink-soft">
          {value.cluster.kind === "catalog" && !value.cluster.acceleratorId
            ? "Pick an accelerator to cost this plan; until then the draft carries no budget."
            : "The cluster and settings are saved with the draft (Save draft, below). The server recomputes the figures on every save and freezes them when the revision is submitted."}
        </p>
      }
    />
  );
  return (
    <section className="flex flex-col gap-3" aria-label="Budget sheet">
      <header>
        <h2 className="text-title font-semibold">Budget</h2>
        <p className="text-body text-ink-soft">
          What the stages cost on the chosen accelerators, and whether each fits in memory. Lengths, batches and steps
          typed here are the stages' own.
        </p>
      </header>
      {stages.length === 0 ? (
        <p className="text-body text-ink-soft">
          Add a stage to cost this plan: the budget sheet works from the plan's stages.
        </p>
      ) : (
        sheet
      )}
    </section>
  );
}
