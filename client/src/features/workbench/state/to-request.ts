import {
  analysisRequestSchema,
  modelDependentIssues,
  type AnalysisRequest,
  type MethodParams,
  type ModelShape,
} from "@shared/schemas/analysis";
import { plainSentence } from "@shared/validation-messages";
import type { MethodRow, WorkbenchInputs } from "./inputs";
import { methodEntry } from "./method-fields";

/** Errors keyed like the API's `fields`: "targetContext", "bands.beta", "methods.1.factor", "model.headDim". */
export type FieldErrors = Record<string, string>;

const toNumber = (raw: string) => (raw.trim() === "" ? undefined : Number(raw.replace(/[\s_]/g, "")));
const toList = (raw: string) =>
  raw.trim() === ""
    ? undefined
    : raw
        .split(/[\s,;]+/)
        .filter(Boolean)
        .map(Number);

function methodBody(row: MethodRow): Record<string, unknown> {
  const body: Record<string, unknown> = { method: row.method };
  for (const field of methodEntry(row.method).fields) {
    const raw = row.params[field.key] ?? "";
    const value =
      field.kind === "list"
        ? toList(raw)
        : field.kind === "boolean"
          ? raw === ""
            ? undefined
            : raw === "true"
          : toNumber(raw);
    if (value !== undefined) body[field.key] = value;
  }
  return body;
}

/**
 * The POST /api/analyses body for the inputs, checked with the shared contract. For a saved profile the rules that
 * need the model (target above the trained length, list lengths) run here too, on the profile's shape.
 */
export function toRequest(
  inputs: WorkbenchInputs,
  savedShape: ModelShape | null,
): { request: AnalysisRequest | null; errors: FieldErrors } {
  const m = inputs.model;
  // A layer group other than the scaled one is sent as its own shape (its base and rotary dimension); the stored
  // profile's top level is the scaled group's.
  const model =
    m.kind === "saved" && m.group && savedShape
      ? savedShape
      : m.kind === "saved"
        ? { modelId: m.id ?? undefined }
        : {
            headDim: toNumber(m.headDim),
            ropeTheta: toNumber(m.ropeTheta),
            trainedContext: toNumber(m.trainedContext),
            ...(m.partialRotaryFactor.trim() ? { partialRotaryFactor: toNumber(m.partialRotaryFactor) } : {}),
          };
  const alpha = toNumber(inputs.alpha),
    beta = toNumber(inputs.beta);
  const body = {
    model,
    targetContext: toNumber(inputs.target),
    ...(alpha !== undefined || beta !== undefined ? { bands: { alpha: alpha ?? 1, beta: beta ?? 32 } } : {}),
    methods: inputs.methods.map(methodBody),
  };
  const parsed = analysisRequestSchema.safeParse(body);
  const errors: FieldErrors = {};
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const key = issue.path.join(".") || "(body)";
      errors[key] ??= plainSentence(issue.path, issue.message);
    }
    if (m.kind === "saved" && m.id === null) errors.model = "Pick a model profile.";
    return { request: null, errors };
  }
  if (savedShape) {
    for (const issue of modelDependentIssues(
      savedShape,
      parsed.data.targetContext,
      parsed.data.methods as MethodParams[],
    )) {
      errors[issue.path.join(".")] ??= plainSentence(issue.path, issue.message);
    }
    if (Object.keys(errors).length) return { request: null, errors };
  }
  return { request: parsed.data, errors };
}
