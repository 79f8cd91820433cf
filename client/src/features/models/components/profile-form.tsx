import { useState } from "react";
import { useForm, useWatch, type FieldNamesMarkedBoolean } from "react-hook-form";
import { formResolver } from "@/lib/form-resolver";
import { modelProfileInputSchema, type ModelProfileInput, type ModelProfileValues } from "@shared/schemas/models";
import { SubmitButton } from "@/components/button";
import { TextAreaField, TextField } from "@/components/field";
import { Notice } from "@/components/notice";
import { applyApiErrors } from "@/lib/form-errors";
import { PROFILE_FIELD_NAMES, PROFILE_SECTIONS, toNumber } from "./profile-fields";
import { RotaryShapeSummary } from "./rotary-shape-summary";

export type ProfileFormProps = {
  defaultValues: Partial<ModelProfileInput>;
  submitLabel: string;
  busyLabel: string;
  busy: boolean;
  /** Reject with the API error to have its fields shown beside the inputs. */
  onSubmit: (values: ModelProfileValues, edited: Partial<ModelProfileInput>) => Promise<unknown>;
  ariaLabel: string;
};

/** Picks the values the user changed, for the import's `overrides`. */
function editedValues(
  values: ModelProfileValues,
  dirty: Partial<FieldNamesMarkedBoolean<ModelProfileInput>>,
): Partial<ModelProfileInput> {
  const out: Record<string, unknown> = {};
  for (const key of Object.keys(dirty) as (keyof ModelProfileInput)[]) if (dirty[key]) out[key] = values[key];
  return out as Partial<ModelProfileInput>;
}

/** Create, edit, or confirm an imported profile: one form, validated by the shared contract. */
export function ProfileForm({ defaultValues, submitLabel, busyLabel, busy, onSubmit, ariaLabel }: ProfileFormProps) {
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, control, formState } = useForm<
    ModelProfileInput,
    unknown,
    ModelProfileValues
  >({
    resolver: formResolver(modelProfileInputSchema),
    defaultValues,
  });
  const { errors, dirtyFields } = formState;
  const [headDim, partialRotaryFactor] = useWatch({ control, name: ["headDim", "partialRotaryFactor"] });

  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await onSubmit(values, editedValues(values, dirtyFields));
    } catch (error) {
      setFormError(applyApiErrors(error, setError, PROFILE_FIELD_NAMES));
    }
  });

  return (
    <form onSubmit={submit} noValidate aria-label={ariaLabel} className="flex flex-col gap-5">
      {formError && <Notice tone="alert">{formError}</Notice>}
      <div className="flex flex-col gap-5">
        {PROFILE_SECTIONS.map((section) => (
          <div key={section.title} className="flex flex-col gap-3">
            <h3 className="text-note font-semibold tracking-wide text-ink-soft uppercase">{section.title}</h3>
            <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
              {section.fields.map((f) => {
                const error = errors[f.name]?.message;
                if (f.kind === "long-text") {
                  return (
                    <div key={f.name} className="sm:col-span-2 lg:col-span-3">
                      <TextAreaField label={f.label} error={error} hint={f.hint} rows={2} {...register(f.name)} />
                    </div>
                  );
                }
                const numeric = f.kind !== "text";
                return (
                  <TextField
                    key={f.name}
                    label={f.label}
                    hint={f.hint}
                    error={error}
                    type={numeric ? "number" : "text"}
                    step={numeric ? (f.step ?? "1") : undefined}
                    inputMode={numeric ? "decimal" : undefined}
                    {...register(f.name, numeric ? { setValueAs: toNumber(f.kind === "optional-number") } : {})}
                  />
                );
              })}
            </div>
            {section.title === "Rotary shape" && (
              <RotaryShapeSummary headDim={headDim} partialRotaryFactor={partialRotaryFactor} />
            )}
          </div>
        ))}
      </div>
      <div>
        <SubmitButton busy={busy} busyLabel={busyLabel}>
          {submitLabel}
        </SubmitButton>
      </div>
    </form>
  );
}
