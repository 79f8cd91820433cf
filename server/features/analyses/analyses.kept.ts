import canonicalize from "canonicalize";
import { LRUCache } from "lru-cache";
import { ENGINE_VERSION } from "../../engine";
import { PreparedJson } from "../../platform/prepared-json";
import { packAnalysis } from "../../../shared/analysis-columns";
import type { AnalysisResponse, ResolvedAnalysisRequest } from "../../../shared/schemas/analysis";
import type { AnalysisColumnsResponse } from "../../../shared/schemas/analysis-columns";

/**
 * Answers kept in this process, keyed by the resolved request (model shape, target, bands, methods) and the engine
 * version: the engine is pure, so a repeated question is a lookup. Not shared between instances: an answer costs a
 * few milliseconds to compute, less than a round trip to PostgreSQL would save at this size. Kept objects are never
 * mutated.
 *
 * Each answer is kept in both forms as prepared JSON (server/platform/prepared-json.ts): the form a client asks for is
 * built, serialised and compressed once, so asking again costs neither JSON.stringify nor compression
 * (docs/scale-figures.md "Analyses request, where the time goes").
 */
export class KeptAnalysis {
  readonly rows: PreparedJson<AnalysisResponse>;
  #columns: PreparedJson<AnalysisColumnsResponse> | undefined;

  constructor(answer: AnalysisResponse) {
    this.rows = new PreparedJson(answer);
  }

  get columns(): PreparedJson<AnalysisColumnsResponse> {
    return (this.#columns ??= new PreparedJson(packAnalysis(this.rows.value)));
  }
}

// About what one pair object costs as JSON (measured: 149 820 B / 512 rows ≈ 293). An entry holds the engine's
// objects, the row JSON (about that size), the column JSON (0.29× of it) and up to two compressed copies of each
// (about 0.14× each: 48 kB → 17 kB and 167 kB → 23 kB, `npm run bench -- speed`): counted as 3× the row JSON.
const BYTES_PER_PAIR_ROW = 320;
const kept = new LRUCache<string, KeptAnalysis>({
  maxSize: 96 * 1024 * 1024,
  sizeCalculation: (a) => 3 * (16_384 + a.rows.value.methods.length * a.rows.value.model.pairs * BYTES_PER_PAIR_ROW),
});

export const keyOf = (request: ResolvedAnalysisRequest) =>
  `${ENGINE_VERSION}|${canonicalize({
    model: request.model,
    targetContext: request.targetContext,
    bands: request.bands ?? null,
    methods: request.methods,
  })}`;

export const findKeptAnalysis = (key: string) => kept.get(key);
export function keepAnalysis(key: string, answer: AnalysisResponse): KeptAnalysis {
  const entry = new KeptAnalysis(answer);
  kept.set(key, entry);
  return entry;
}
/** Tests: every answer is computed afresh. */
export const forgetKeptAnalyses = () => kept.clear();
