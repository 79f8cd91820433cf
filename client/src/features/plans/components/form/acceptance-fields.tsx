import { useFieldArray, useFormContext, useWatch } from "react-hook-form";
import { COMPARISONS } from "@shared/schemas/plans";
import { EVIDENCE_KINDS, EVIDENCE_KIND_INFO } from "@shared/schemas/evidence";
import { Button } from "@/components/button";
import { SelectField } from "@/components/field";
import type { RevisionForm } from "@/features/plans/lib/form-values";
import { NumberField, TextFormField, useFieldError } from "./form-field";

function ComparisonField({ index }: { index: number }) {
  const { register } = useFormContext<RevisionForm>();
  const name = `revision.acceptance.${index}.comparison` as const;
  const error = useFieldError(name);
  return (
    <SelectField label="Comparison" error={error} {...register(name)}>
      {COMPARISONS.map((c) => (
        <option key={c} value={c}>
          {c}
        </option>
      ))}
    </SelectField>
  );
}

/** The fixed kind decides which uploaded evidence is compared; its meaning shows beside the picker. */
function KindField({ index }: { index: number }) {
  const { register, control } = useFormContext<RevisionForm>();
  const name = `revision.acceptance.${index}.kind` as const;
  const error = useFieldError(name);
  const kind = useWatch({ control, name });
  const info = kind ? EVIDENCE_KIND_INFO[kind] : null;
  return (
    <div className="sm:col-span-2 lg:col-span-6">
      <SelectField
        label="Kind"
        error={error}
        {...register(name, { setValueAs: (v: string) => (v === "" ? undefined : v) })}
      >
        <option value="">none (free text, no evidence decides it)</option>
        {EVIDENCE_KINDS.map((k) => (
          <option key={k} value={k}>
            {EVIDENCE_KIND_INFO[k].label}
          </option>
        ))}
      </SelectField>
      {info && (
        <p className="mt-1 text-body text-ink-soft" data-testid={`kind-explains-${index}`}>
          {info.explains} Compared: {info.observed}.
        </p>
      )}
    </div>
  );
}

/** Acceptance criteria: the long-context evaluations the tuned model must pass. */
export function AcceptanceFields() {
  const { control, getValues } = useFormContext<RevisionForm>();
  const { fields, append, remove } = useFieldArray({ control, name: "revision.acceptance" });
  return (
    <div className="flex flex-col gap-3">
      {fields.map((field, i) => (
        <fieldset
          key={field.id}
          className="grid gap-3 rounded-md border border-rule bg-white/40 p-4 sm:grid-cols-2 lg:grid-cols-[2fr_1fr_1fr_6rem_1fr_auto] lg:items-end"
        >
          <legend className="px-1 text-body font-semibold">Criterion {i + 1}</legend>
          <TextFormField
            name={`revision.acceptance.${i}.evaluation`}
            label="Evaluation"
            hint="e.g. passkey retrieval"
          />
          <NumberField name={`revision.acceptance.${i}.contextLength`} label="At context (tokens)" step="1" />
          <TextFormField name={`revision.acceptance.${i}.metric`} label="Metric" />
          <ComparisonField index={i} />
          <NumberField name={`revision.acceptance.${i}.threshold`} label="Threshold" />
          <div className="pb-0.5">
            <Button variant="danger" size="sm" onClick={() => remove(i)}>
              Remove
            </Button>
          </div>
          <KindField index={i} />
        </fieldset>
      ))}
      <div>
        <Button
          variant="secondary"
          onClick={() =>
            append({
              evaluation: "",
              contextLength: getValues("revision.targetContext") || 0,
              metric: "accuracy",
              comparison: ">=",
              threshold: 0.9,
              kind: "passkey",
            })
          }
        >
          Add acceptance criterion
        </Button>
      </div>
    </div>
  );
}
