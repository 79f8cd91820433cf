import { analyse } from "../../engine";
import { Invalid } from "../../platform/errors";
import { invalidFields } from "../../platform/validate";
import { analyseOffThread } from "./analyses.pool";
import { takeHeavySlot } from "./analyses.limits";
import { findKeptAnalysis, keepAnalysis, keyOf, type KeptAnalysis } from "./analyses.kept";
import type { PreparedJson } from "../../platform/prepared-json";
import type { AnalysisColumnsResponse } from "../../../shared/schemas/analysis-columns";
import {
  ANALYSIS_INLINE_WORK,
  modelDependentIssues,
  rotaryShapeSchema,
  rotaryDimension,
  type AnalysisRequest,
  type AnalysisResponse,
  type ModelShape,
} from "../../../shared/schemas/analysis";

/** Looks a stored model profile up by id; throws NotFound when there is none. */
export type ResolveModel = (modelId: number) => Promise<Partial<Record<keyof ModelShape, unknown>>>;

const SHAPE_KEYS = Object.keys(rotaryShapeSchema.shape) as (keyof ModelShape)[];

/** Keeps the engine's fields of a stored profile, dropping nulls (absent optional values). */
function toModelShape(stored: Partial<Record<keyof ModelShape, unknown>>): ModelShape {
  const picked: Record<string, unknown> = {};
  for (const key of SHAPE_KEYS) if (stored[key] !== null && stored[key] !== undefined) picked[key] = stored[key];
  const parsed = rotaryShapeSchema.safeParse(picked);
  if (!parsed.success) {
    const { fields } = invalidFields(
      parsed.error.issues.map((i) => ({ path: ["model", ...i.path], message: i.message })),
    );
    throw new Invalid("The stored model profile cannot be analysed.", fields);
  }
  return parsed.data;
}

export interface AnalyseOptions {
  /** Who asks: large analyses are capped per user. */
  userId: number;
  /** Aborted when the client goes away; a large analysis in a pool thread is then dropped. */
  signal?: AbortSignal;
}

/** Rotary pairs × methods: what the engine's cost and the response size grow with. */
export const analysisWork = (model: ModelShape, methods: number) => ((rotaryDimension(model) ?? 0) / 2) * methods;

/**
 * Stateless comparison: resolves { modelId }, applies the rules that need the model, runs the engine —
 * in the request for small analyses, in a pool thread (at most HEAVY_ANALYSES_PER_USER at once per user) for large ones.
 * A question asked before is answered from the kept answers (analyses.kept.ts). `form: "columns"` answers the same
 * numbers in the column form. The answer comes prepared (serialised once, compressed once per encoding).
 */
export async function analyseRequest(
  input: AnalysisRequest,
  resolveModel: ResolveModel,
  opts: AnalyseOptions,
): Promise<PreparedJson<AnalysisResponse> | PreparedJson<AnalysisColumnsResponse>> {
  const kept = await analyseKept(input, resolveModel, opts);
  return input.form === "columns" ? kept.columns : kept.rows;
}

async function analyseKept(
  input: AnalysisRequest,
  resolveModel: ResolveModel,
  opts: AnalyseOptions,
): Promise<KeptAnalysis> {
  const model = "modelId" in input.model ? toModelShape(await resolveModel(input.model.modelId)) : input.model;
  const issues = modelDependentIssues(model, input.targetContext, input.methods);
  if (issues.length) {
    throw invalidFields(issues);
  }
  const request = { model, targetContext: input.targetContext, bands: input.bands, methods: input.methods };
  const key = keyOf(request);
  const kept = findKeptAnalysis(key);
  if (kept) return kept;
  let answer: AnalysisResponse;
  if (analysisWork(model, input.methods.length) <= ANALYSIS_INLINE_WORK) answer = analyse(request);
  else {
    const release = takeHeavySlot(opts.userId);
    try {
      answer = await analyseOffThread(request, opts.signal);
    } finally {
      release();
    }
  }
  return keepAnalysis(key, answer, input.form ?? "rows");
}
