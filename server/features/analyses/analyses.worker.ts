import { analyse } from "../../engine";
import type { AnalysisResponse, ResolvedAnalysisRequest } from "../../../shared/schemas/analysis";

/** Runs inside a pool thread (analyses.pool.ts): the same pure engine call as the inline path. */
export default function analyseInWorker(request: ResolvedAnalysisRequest): AnalysisResponse {
  return analyse(request);
}
