import type { ReactNode } from "react";
import type { ModelProfile } from "@shared/schemas/models";
import { Panel } from "@/components/page";
import { shippedMethod } from "@shared/lineage";
import { suggestedTarget } from "../state/defaults";
import type { ModelChoice, WorkbenchInputs as Inputs } from "../state/inputs";
import type { FieldContext } from "../state/method-fields";
import type { FieldErrors } from "../state/to-request";
import { MethodRows } from "./method-rows";
import { ModelInput } from "./model-input";
import { WindowInputs } from "./window-inputs";

type WorkbenchInputsProps = {
  inputs: Inputs;
  onChange: (next: Inputs) => void;
  profiles: ModelProfile[];
  chosen: ModelProfile | null;
  trainedContext: number | null;
  context: FieldContext;
  errors: FieldErrors;
  profileNotes?: ReactNode;
  profileSearch?: ReactNode;
};

/** Everything that defines the view: model, lengths and bands, the methods to compare. */
export function WorkbenchInputs({
  inputs,
  onChange,
  profiles,
  chosen,
  trainedContext,
  context,
  errors,
  profileNotes,
  profileSearch,
}: WorkbenchInputsProps) {
  const pickModel = (model: ModelChoice) => {
    const next = { ...inputs, model };
    // A new profile with a longer trained length than the target gets a fresh target rather than an error.
    const picked = model.kind === "saved" ? profiles.find((p) => p.id === model.id) : undefined;
    if (picked && !(Number(inputs.target) > picked.trainedContext))
      next.target = suggestedTarget(picked.trainedContext);
    onChange(next);
  };
  return (
    <Panel
      title="Inputs"
      aside={
        <span className="text-note text-ink-soft">
          Results follow as you type; the address bar keeps every input, so a link reproduces this view.
        </span>
      }
    >
      <div className="grid gap-6 lg:grid-cols-[minmax(0,5fr)_minmax(0,7fr)] xl:grid-cols-1">
        <div className="flex min-w-0 flex-col gap-4">
          <ModelInput
            choice={inputs.model}
            profiles={profiles}
            onChange={pickModel}
            errors={errors}
            search={profileSearch}
          />
          {chosen && (
            <p className="text-note text-ink-soft">
              {chosen.family} · d = {chosen.rotaryDim} ({chosen.pairs} pairs) ·{" "}
              {chosen.sourceFileName ? `imported from ${chosen.sourceFileName}` : "typed in"}
            </p>
          )}
          <WindowInputs
            target={inputs.target}
            alpha={inputs.alpha}
            beta={inputs.beta}
            trainedContext={trainedContext}
            errors={errors}
            onChange={(patch) => onChange({ ...inputs, ...patch })}
          />
        </div>
        <div className="flex min-w-0 flex-col gap-2">
          <h3 className="text-note font-semibold tracking-wide text-ink-soft uppercase">Methods to compare</h3>
          <MethodRows
            rows={inputs.methods}
            shipped={
              inputs.model.kind === "saved" && !inputs.model.group ? shippedMethod(chosen?.currentScaling) : null
            }
            context={context}
            errors={errors}
            onChange={(methods) => onChange({ ...inputs, methods, view: Math.min(inputs.view, methods.length - 1) })}
          />
        </div>
      </div>
      {profileNotes && <div className="mt-5">{profileNotes}</div>}
    </Panel>
  );
}
