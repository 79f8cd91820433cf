import type { ReactNode } from "react";
import { useFormContext } from "react-hook-form";
import { Field } from "@/components/field";
import type { RevisionForm } from "@/features/plans/lib/form-values";
import { AcceptanceFields } from "./acceptance-fields";
import { BandsField } from "./bands-field";
import { NumberField, useFieldError } from "./form-field";
import { LiveFlags, type AnalysisModel } from "./live-flags";
import { MethodFields } from "./method-fields";
import { StagesFields } from "./stages-fields";
import { ExtendsFromField, type PlanLineage } from "./extends-from-field";

function Section({ title, children, lead }: { title: string; lead?: string; children: ReactNode }) {
  return (
    <section className="flex flex-col gap-3 border-t border-rule pt-4">
      <h2 className="text-title font-semibold">{title}</h2>
      {lead && <p className="-mt-2 text-note text-ink-soft">{lead}</p>}
      {children}
    </section>
  );
}

/**
 * Everything a revision holds, under `revision.*` of the surrounding form: target and method (checked live
 * against the engine), band edges, stages, acceptance criteria and notes.
 */
export function RevisionFields({
  model,
  afterStages,
  lineage = null,
}: {
  model: AnalysisModel | null;
  afterStages?: ReactNode;
  /** Only for a model that ships scaling: its two lengths and the shipped method. */
  lineage?: PlanLineage | null;
}) {
  const { register } = useFormContext<RevisionForm>();
  const notesError = useFieldError("revision.notes");
  return (
    <div className="flex flex-col gap-6">
      <Section
        title="Target and method"
        lead="Where the plan ends up, and how the rotary frequencies are rescaled to get there."
      >
        <div className="grid gap-3 sm:grid-cols-2">
          <NumberField
            name="revision.targetContext"
            label="Target context (tokens)"
            step="1"
            hint="The context length the tuned model should handle"
          />
        </div>
        {lineage && <ExtendsFromField lineage={lineage} />}
        <MethodFields name="revision.method" />
        <details className="rounded-md border border-rule px-3 py-2">
          <summary className="cursor-pointer text-body font-medium">Band edges</summary>
          <div className="pt-3">
            <BandsField />
          </div>
        </details>
        <LiveFlags model={model} />
      </Section>
      <Section title="Stages" lead="Each stage is one fine-tuning run at a longer sequence length.">
        <StagesFields />
      </Section>
      {afterStages}
      <Section
        title="Acceptance criteria"
        lead="Figures here are estimates; only long-context evaluations of the tuned model confirm a plan."
      >
        <AcceptanceFields />
      </Section>
      <Section title="Notes">
        <Field label="Notes for inspectors" error={notesError}>
          {({ id, describedBy, invalid }) => (
            <textarea
              id={id}
              rows={5}
              aria-describedby={describedBy}
              aria-invalid={invalid}
              className="w-full rounded-md border border-rule-strong bg-white/70 px-3 py-2 text-body focus:border-seaglass focus:outline-2 focus:outline-seaglass/30"
              {...register("revision.notes")}
            />
          )}
        </Field>
      </Section>
    </div>
  );
}
