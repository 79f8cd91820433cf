import canonicalize from "canonicalize";
import { LRUCache } from "lru-cache";
import { ENGINE_VERSION } from "../../engine";
import { PreparedJson } from "../../platform/prepared-json";
import { expandAnalysis, packAnalysis } from "../../../shared/analysis-columns";
import type { AnalysisResponse, ResolvedAnalysisRequest } from "../../../shared/schemas/analysis";
import type { AnalysisColumnsResponse } from "../../../shared/schemas/analysis-columns";

/**
 * Answers kept in this process, keyed by the resolved request (model shape, target, bands, methods) and the engine
 * version: the engine is pure, so a repeated question is a lookup. Not shared between instances: an answer costs a
 * few milliseconds to compute, less than a round trip to PostgreSQL would save at this size.
 *
 * Each answer is kept as prepared JSON (server/platform/prepared-json.ts) in the form first asked for, serialised and
 * compressed once, so asking again costs neither JSON.stringify nor compression (docs/scale-figures.md "Analyses
 * request, where the time goes"). Only bytes are kept, never the engine's objects: thousands of kept objects per
 * answer made every new answer's garbage collection slower ("New questions: what repeats between them"). The other
 * form is derived from the kept bytes when first asked for; packAnalysis and expandAnalysis give the same JSON the
 * engine's objects would (tests/unit/analysis-columns.test.ts).
 */
export class KeptAnalysis {
  #rows: PreparedJson<AnalysisResponse> | undefined;
  #columns: PreparedJson<AnalysisColumnsResponse> | undefined;

  constructor(answer: AnalysisResponse, form: AnalysisForm) {
    if (form === "columns") this.#columns = new PreparedJson(packAnalysis(answer));
    else this.#rows = new PreparedJson(answer);
  }

  get rows(): PreparedJson<AnalysisResponse> {
    return (this.#rows ??= new PreparedJson(expandAnalysis(this.#columns!.value)));
  }

  get columns(): PreparedJson<AnalysisColumnsResponse> {
    return (this.#columns ??= new PreparedJson(packAnalysis(this.#rows!.value)));
  }

  /** Bytes held now or later: the row JSON (the column JSON is about 0.29× of it), both forms and their compressions. */
  get size() {
    const rowBytes = this.#rows?.json.length ?? Math.ceil((this.#columns?.json.length ?? 0) / 0.29);
    return 16_384 + 2 * rowBytes;
  }
}

export type AnalysisForm = "rows" | "columns";

// Counted as 2× the row JSON: the row JSON, the column JSON (0.29× of it), a compressed copy or two of each (about
// 0.14× each: 48 kB → 17 kB and 167 kB → 23 kB, `npm run bench -- speed`), rounded up.
const kept = new LRUCache<string, KeptAnalysis>({
  maxSize: 96 * 1024 * 1024,
  sizeCalculation: (a) => a.size,
});

export const keyOf = (request: ResolvedAnalysisRequest) =>
  `${ENGINE_VERSION}|${canonicalize({
    model: request.model,
    targetContext: request.targetContext,
    bands: request.bands ?? null,
    methods: request.methods,
  })}`;

export const findKeptAnalysis = (key: string) => kept.get(key);
export function keepAnalysis(key: string, answer: AnalysisResponse, form: AnalysisForm): KeptAnalysis {
  const entry = new KeptAnalysis(answer, form);
  kept.set(key, entry);
  return entry;
}
/** Tests: every answer is computed afresh. */
export const forgetKeptAnalyses = () => kept.clear();
