import { useEffect, useState, type ReactNode } from "react";
import { FormProvider, useForm, useWatch } from "react-hook-form";
import { formResolver } from "@/lib/form-resolver";
import { createPlanRequestSchema } from "@shared/schemas/plans";
import type { PlanDetail } from "@shared/schemas/plans";
import type { ModelProfile } from "@shared/schemas/models";
import { SubmitButton } from "@/components/button";
import { SelectField, TextField } from "@/components/field";
import { Notice } from "@/components/notice";
import { formatCount } from "@/lib/format";
import { useCreatePlan } from "../api/create-plan";
import { blankRevision, toNumber } from "../lib/form-values";
import { invalidSummary, placeServerErrors } from "../lib/server-errors";
import { RevisionFields } from "./form/revision-fields";
import { shippedMethod } from "@shared/lineage";

type NewPlanFormProps = {
  models: ModelProfile[];
  /** The lab-wide minimum of approvals; the plan may ask for more, never fewer. */
  minApprovals: number;
  onCreated: (plan: PlanDetail) => void;
  /** Rendered after the stages, inside the form (the budget sheet's place). */
  afterStages?: ReactNode;
  /** The search box that narrows `models` (the server pages profiles), shown above the fields. */
  modelSearch?: ReactNode;
  /** Hears the chosen model id, so the page keeps offering it whatever the search. */
  onModelPicked?: (id: number | undefined) => void;
};

/** Title, model and approvals for a new plan, then its first revision; saved as a draft. */
export function NewPlanForm({
  models,
  minApprovals,
  onCreated,
  afterStages,
  modelSearch,
  onModelPicked,
}: NewPlanFormProps) {
  const create = useCreatePlan();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm({
    resolver: formResolver(createPlanRequestSchema),
    defaultValues: {
      title: "",
      purpose: "",
      modelId: undefined as unknown as number,
      requiredApprovals: minApprovals,
      revision: blankRevision(),
    },
  });
  const { register, handleSubmit, setError, formState, control } = form;
  const modelId = useWatch({ control, name: "modelId" });
  const model = models.find((m) => m.id === modelId);
  // The route keeps the choice offered while a search narrows the list (the server pages profiles).
  useEffect(() => onModelPicked?.(modelId), [modelId, onModelPicked]);

  const onSubmit = handleSubmit(
    (values) => {
      setFormError(null);
      create.mutate(values, { onSuccess: onCreated, onError: (e) => setFormError(placeServerErrors(e, setError)) });
    },
    (errors) => setFormError(invalidSummary(errors)),
  );

  return (
    <FormProvider {...form}>
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-6" aria-label="New plan">
        {formError && (
          <Notice tone="alert" title="Not saved">
            {formError}
          </Notice>
        )}
        {modelSearch}
        <div className="grid gap-4 md:grid-cols-2">
          <TextField label="Title" error={formState.errors.title?.message} {...register("title")} />
          <SelectField
            label="Model"
            error={formState.errors.modelId?.message}
            hint={
              model
                ? `${model.family}; trained on ${formatCount(model.trainedContext)} tokens, base ${formatCount(model.ropeTheta)}`
                : "The profile this plan extends"
            }
            {...register("modelId", { setValueAs: toNumber })}
          >
            <option value="">Pick a model profile</option>
            {models
              .filter((m) => !m.retiredAt)
              .map((m) => (
                <option key={m.id} value={m.id}>
                  {m.name}
                </option>
              ))}
          </SelectField>
          <TextField
            label="Purpose"
            hint="Why this extension, in a sentence"
            error={formState.errors.purpose?.message}
            {...register("purpose")}
          />
          <SelectField
            label="Passes required"
            error={formState.errors.requiredApprovals?.message}
            hint={`The lab asks for at least ${minApprovals}.`}
            {...register("requiredApprovals", { setValueAs: toNumber })}
          >
            {[1, 2, 3]
              .filter((n) => n >= minApprovals)
              .map((n) => (
                <option key={n} value={n}>
                  {n}
                </option>
              ))}
          </SelectField>
        </div>
        <RevisionFields
          model={model ? { modelId: model.id } : null}
          afterStages={afterStages}
          lineage={
            model?.currentScaling
              ? {
                  pretrainedContext: model.pretrainedContext,
                  servedContext: model.servedContext,
                  shipped: shippedMethod(model.currentScaling),
                }
              : null
          }
        />
        <div className="border-t border-rule pt-4">
          <SubmitButton busy={create.isPending} busyLabel="Saving draft…">
            Save draft
          </SubmitButton>
        </div>
      </form>
    </FormProvider>
  );
}
