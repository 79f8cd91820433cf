import { analyse } from "../../engine";
import { Invalid } from "../../http/errors";
import {
  modelDependentIssues, modelShapeSchema,
  type AnalysisRequest, type AnalysisResponse, type ModelShape,
} from "../../../shared/schemas/analysis";

/** Looks a stored model profile up by id; throws NotFound when there is none. */
export type ResolveModel = (modelId: number) => Promise<Partial<Record<keyof ModelShape, unknown>>>;

const SHAPE_KEYS = Object.keys(modelShapeSchema.shape) as (keyof ModelShape)[];

/** Keeps the engine's fields of a stored profile, dropping nulls (absent optional values). */
function toModelShape(stored: Partial<Record<keyof ModelShape, unknown>>): ModelShape {
  const picked: Record<string, unknown> = {};
  for (const key of SHAPE_KEYS) if (stored[key] !== null && stored[key] !== undefined) picked[key] = stored[key];
  const parsed = modelShapeSchema.safeParse(picked);
  if (!parsed.success) {
    const fields = Object.fromEntries(parsed.error.issues.map((i) => [["model", ...i.path].join("."), i.message]));
    throw new Invalid("the stored model profile cannot be analysed", fields);
  }
  return parsed.data;
}

/** Stateless comparison: resolves { modelId }, applies the rules that need the model, runs the engine. */
export async function analyseRequest(input: AnalysisRequest, resolveModel: ResolveModel): Promise<AnalysisResponse> {
  const model = "modelId" in input.model ? toModelShape(await resolveModel(input.model.modelId)) : input.model;
  const issues = modelDependentIssues(model, input.targetContext, input.methods);
  if (issues.length) {
    const fields = Object.fromEntries(issues.map((i) => [i.path.join("."), i.message]));
    throw new Invalid(`invalid body: ${Object.keys(fields).join(", ")}`, fields);
  }
  return analyse({ model, targetContext: input.targetContext, bands: input.bands, methods: input.methods });
}
