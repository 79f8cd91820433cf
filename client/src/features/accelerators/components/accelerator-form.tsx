import { useState } from "react";
import { Controller, useForm } from "react-hook-form";
import { formResolver } from "@/lib/form-resolver";
import { acceleratorInputSchema, type Accelerator } from "@shared/schemas/budget";
import { Button, SubmitButton } from "@/components/button";
import { TextField } from "@/components/field";
import { Notice } from "@/components/notice";
import { GIB, TFLOPS } from "@/lib/format";
import { applyApiErrors } from "@/lib/form-errors";
import { useCreateAccelerator, useUpdateAccelerator } from "../api/save-accelerator";
import { UnitNumberInput } from "./unit-number-input";

const FIELDS = ["name", "memoryBytes", "peakFlops", "pricePerHour", "notes"] as const;

type Props = { editing?: Accelerator; onDone: (message: string) => void; onCancel?: () => void };

/** Add an accelerator, or edit one (`editing`). Figures are typed in GiB and TFLOP/s and stored in bytes and FLOP/s. */
export function AcceleratorForm({ editing, onDone, onCancel }: Props) {
  const create = useCreateAccelerator();
  const update = useUpdateAccelerator();
  const [formError, setFormError] = useState<string | null>(null);
  const { register, control, handleSubmit, setError, formState } = useForm({
    resolver: formResolver(acceleratorInputSchema),
    defaultValues: editing
      ? {
          name: editing.name,
          memoryBytes: editing.memoryBytes,
          peakFlops: editing.peakFlops,
          pricePerHour: editing.pricePerHour,
          notes: editing.notes,
        }
      : { name: "", notes: "" },
  });
  const { errors } = formState;
  const busy = create.isPending || update.isPending;
  const label = editing ? `Edit ${editing.name}` : "Add an accelerator";

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    const onError = (error: unknown) => setFormError(applyApiErrors(error, setError, FIELDS));
    if (editing)
      update.mutate({ id: editing.id, changes: values }, { onSuccess: (a) => onDone(`Saved ${a.name}.`), onError });
    else create.mutate(values, { onSuccess: (a) => onDone(`Added ${a.name} to the catalog.`), onError });
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label={label} className="flex flex-col gap-4">
      {formError && <Notice tone="alert">{formError}</Notice>}
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Name" autoComplete="off" error={errors.name?.message} {...register("name")} />
        <TextField
          label="Price per accelerator-hour"
          inputMode="decimal"
          autoComplete="off"
          hint="In the workspace's currency"
          error={errors.pricePerHour?.message}
          {...register("pricePerHour", { setValueAs: (v: string | number) => (v === "" ? undefined : Number(v)) })}
        />
        <Controller
          control={control}
          name="memoryBytes"
          render={({ field }) => (
            <UnitNumberInput
              label="Memory"
              unit="GiB"
              scale={GIB}
              value={field.value}
              onChange={field.onChange}
              onBlur={field.onBlur}
              error={errors.memoryBytes?.message}
              hint="Per accelerator; 1 GiB = 2³⁰ bytes"
            />
          )}
        />
        <Controller
          control={control}
          name="peakFlops"
          render={({ field }) => (
            <UnitNumberInput
              label="Dense peak"
              unit="TFLOP/s"
              scale={TFLOPS}
              value={field.value}
              onChange={field.onChange}
              onBlur={field.onBlur}
              error={errors.peakFlops?.message}
              hint="At the training precision, without sparsity"
            />
          )}
        />
      </div>
      <TextField
        label="Notes"
        autoComplete="off"
        hint="Where the figures come from, interconnect, anything a planner should know"
        error={errors.notes?.message}
        {...register("notes")}
      />
      <div className="flex gap-3">
        <SubmitButton busy={busy} busyLabel="Saving…">
          {editing ? "Save changes" : "Add accelerator"}
        </SubmitButton>
        {onCancel && (
          <Button variant="secondary" onClick={onCancel}>
            Cancel
          </Button>
        )}
      </div>
    </form>
  );
}
