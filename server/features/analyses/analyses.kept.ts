import canonicalize from "canonicalize";
import { LRUCache } from "lru-cache";
import { ENGINE_VERSION } from "../../engine";
import type { AnalysisResponse, ResolvedAnalysisRequest } from "../../../shared/schemas/analysis";

/**
 * Answers kept in this process, keyed by the resolved request (model shape, target, bands, methods) and the engine
 * version: the engine is pure, so a repeated question is a lookup. Not shared between instances: an answer costs a
 * few milliseconds to compute, less than a round trip to PostgreSQL would save at this size. Kept objects are never
 * mutated (the route serialises them; the column form builds new objects).
 */
const BYTES_PER_PAIR_ROW = 320; // about what one pair object costs as JSON (measured: 149 820 B / 512 rows ≈ 293)
const kept = new LRUCache<string, AnalysisResponse>({
  maxSize: 64 * 1024 * 1024,
  sizeCalculation: (a) => 16_384 + a.methods.length * a.model.pairs * BYTES_PER_PAIR_ROW,
});

export const keyOf = (request: ResolvedAnalysisRequest) =>
  `${ENGINE_VERSION}|${canonicalize({
    model: request.model,
    targetContext: request.targetContext,
    bands: request.bands ?? null,
    methods: request.methods,
  })}`;

export const findKeptAnalysis = (key: string) => kept.get(key);
export const keepAnalysis = (key: string, answer: AnalysisResponse) => void kept.set(key, answer);
/** Tests: every answer is computed afresh. */
export const forgetKeptAnalyses = () => kept.clear();
