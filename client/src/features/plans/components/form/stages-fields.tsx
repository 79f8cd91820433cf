import { useFieldArray, useFormContext, useWatch } from "react-hook-form";
import { MAX_STAGES } from "@shared/schemas/plans";
import { Button } from "@/components/button";
import { formatCount } from "@/lib/format";
import { newStage, type RevisionForm } from "@/features/plans/lib/form-values";
import { stageTokens } from "@shared/stage-tokens";
import { MethodFields } from "./method-fields";
import { NumberField, TextFormField, useFieldError } from "./form-field";

function StageTokens({ index }: { index: number }) {
  const { control } = useFormContext<RevisionForm>();
  const stage = useWatch({ control, name: `revision.stages.${index}` });
  const tokens = stage
    ? stageTokens({
        steps: Number(stage.steps),
        globalBatch: Number(stage.globalBatch),
        sequenceLength: Number(stage.sequenceLength),
      }).tokens
    : NaN;
  return (
    <p className="text-note text-ink-soft">
      Tokens trained: {Number.isFinite(tokens) ? formatCount(tokens) : "—"} (steps × global batch × sequence length)
    </p>
  );
}

/** The progressive stages as a field array: add, remove, reorder. */
export function StagesFields() {
  const { control, getValues } = useFormContext<RevisionForm>();
  const { fields, append, remove, move } = useFieldArray({ control, name: "revision.stages" });
  const listError = useFieldError("revision.stages");
  return (
    <div className="flex flex-col gap-4">
      {listError && (
        <p className="text-note text-signal" role="alert">
          {listError}
        </p>
      )}
      {fields.length === 0 && (
        <p className="text-body text-ink-soft">
          No stages yet. A staged plan extends the context in steps, each with its own training run.
        </p>
      )}
      {fields.map((field, i) => (
        <fieldset key={field.id} className="flex flex-col gap-3 rounded-md border border-rule bg-white/40 p-4">
          <legend className="px-1 text-body font-semibold">Stage {i + 1}</legend>
          <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
            <NumberField name={`revision.stages.${i}.targetContext`} label="Target context (tokens)" step="1" />
            <NumberField name={`revision.stages.${i}.sequenceLength`} label="Sequence length (tokens)" step="1" />
            <NumberField name={`revision.stages.${i}.steps`} label="Steps" step="1" />
            <NumberField name={`revision.stages.${i}.globalBatch`} label="Global batch (sequences)" step="1" />
            <NumberField name={`revision.stages.${i}.learningRate`} label="Learning rate" hint="For example 2e-5" />
            <TextFormField name={`revision.stages.${i}.dataMix`} label="Data mix" hint="Sources and shares, in words" />
          </div>
          <MethodFields name={`revision.stages.${i}.method`} label="Stage method" collapsed />
          <StageTokens index={i} />
          <div className="flex flex-wrap gap-2">
            <Button variant="secondary" size="sm" disabled={i === 0} onClick={() => move(i, i - 1)}>
              Move up
            </Button>
            <Button variant="secondary" size="sm" disabled={i === fields.length - 1} onClick={() => move(i, i + 1)}>
              Move down
            </Button>
            <Button variant="danger" size="sm" onClick={() => remove(i)}>
              Remove stage {i + 1}
            </Button>
          </div>
        </fieldset>
      ))}
      <div>
        <Button
          variant="secondary"
          disabled={fields.length >= MAX_STAGES}
          onClick={() => {
            const r = getValues("revision");
            append(newStage(r.targetContext, r.method));
          }}
        >
          Add stage
        </Button>
      </div>
    </div>
  );
}
