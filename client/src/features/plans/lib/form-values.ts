import { z } from "zod";
import type { MethodParams } from "@shared/schemas/analysis";
import { revisionInputSchema, type RevisionInput, type StageInput } from "@shared/schemas/plans";
import type { RevisionContent } from "@shared/schemas/plans";

/** Both forms keep the revision under `revision`, so the revision fields are one set of components. */
export type RevisionForm = { revision: RevisionInput };
export const editRevisionFormSchema = z.object({ revision: revisionInputSchema });

/** Number inputs: an empty box is "not given" (the schema then says whether that is allowed). */
export const toNumber = (v: unknown) => (v === "" || v === null || v === undefined ? undefined : Number(v));
/** "1, 1.2 1.5" → [1, 1.2, 1.5]; a stored array comes back as is. */
export const toNumberList = (v: unknown) => {
  if (Array.isArray(v)) return v;
  const text = String(v ?? "").trim();
  return text === ""
    ? undefined
    : text
        .split(/[\s,;]+/)
        .filter(Boolean)
        .map(Number);
};
export const toOptionalBoolean = (v: unknown) =>
  v === "true" || v === true ? true : v === "false" || v === false ? false : undefined;

export const DEFAULT_TARGET = 32_768;

/** A new stage that starts from the plan's own target and method; batch, steps and rate follow the YaRN recipe's scale (Peng et al. 2023). */
export function newStage(targetContext: number | undefined, method: MethodParams | undefined): StageInput {
  const target = targetContext && Number.isFinite(targetContext) ? targetContext : DEFAULT_TARGET;
  return {
    targetContext: target,
    method: method ?? { method: "yarn" },
    steps: 400,
    globalBatch: 64,
    sequenceLength: target,
    learningRate: 2e-5,
    dataMix: "",
  };
}

export function blankRevision(): RevisionInput {
  return { targetContext: DEFAULT_TARGET, method: { method: "yarn" }, stages: [], acceptance: [], notes: "" };
}

/** The editable values of a stored revision (the budget sheet's inputs included, so saving keeps them). */
export function revisionValuesOf(content: RevisionContent): RevisionInput {
  return {
    targetContext: content.targetContext,
    method: content.method,
    ...(content.extendsFrom ? { extendsFrom: content.extendsFrom } : {}),
    ...(content.bands ? { bands: content.bands } : {}),
    stages: content.stages,
    acceptance: content.acceptance,
    notes: content.notes,
    ...(content.budget ? { budget: content.budget.inputs } : {}),
  };
}

const TOP_LEVEL = new Set(["title", "purpose", "modelId", "requiredApprovals"]);
/** Server field names for revision values come bare ("stages.0.steps") or nested ("revision.stages.0.steps"). */
export const formPathOf = (key: string) =>
  TOP_LEVEL.has(key) || key.startsWith("revision.") ? key : `revision.${key}`;
