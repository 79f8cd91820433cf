import type { ModelProfile } from "@shared/schemas/models";
import type { WorkbenchInputs } from "./inputs";

/** A target four times the trained length: a common first step of context extension (common practice, no source). */
export const suggestedTarget = (trainedContext: number) => String(trainedContext * 4);

/** Fills what a bare /workbench link leaves open: the first profile, and a target for it. */
export function withDefaults(inputs: WorkbenchInputs, profiles: ModelProfile[]): WorkbenchInputs {
  let next = inputs;
  if (next.model.kind === "saved" && next.model.id === null && profiles.length)
    next = { ...next, model: { kind: "saved", id: profiles[0].id } };
  const m = next.model;
  const chosen = m.kind === "saved" ? profiles.find((p) => p.id === m.id) : undefined;
  if (next.target === "" && chosen) next = { ...next, target: suggestedTarget(chosen.trainedContext) };
  return next;
}
