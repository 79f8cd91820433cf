import type { AnalysisResponse, PairResult } from "./schemas/analysis";
import type { AnalysisColumnsResponse } from "./schemas/analysis-columns";

// Row form ⇄ column form of an analysis (shared/schemas/analysis-columns.ts). Pure: the server packs, the client
// unpacks, and tests/unit/analysis-columns.test.ts checks that unpacking gives back exactly the engine's rows.

const bit = (b: boolean) => (b ? 1 : 0) as 0 | 1;

export function packAnalysis(full: AnalysisResponse): AnalysisColumnsResponse {
  const { methods, ...rest } = full;
  // Every method's table has the same original-frequency columns (classifyPairs judges on the unscaled θ).
  const first: PairResult[] = methods[0]?.pairs ?? [];
  return {
    form: "columns",
    ...rest,
    pairColumns: {
      invFreq: first.map((p) => p.invFreq),
      wavelength: first.map((p) => p.wavelength),
      rotationsInTrainedWindow: first.map((p) => p.rotationsInTrainedWindow),
      band: first.map((p) => p.band),
      exceedsTrainedWindow: first.map((p) => bit(p.exceedsTrainedWindow)),
    },
    methods: methods.map(({ pairs, ...m }) => ({
      ...m,
      pairColumns: {
        scaledInvFreq: pairs.map((p) => p.scaledInvFreq),
        scaledWavelength: pairs.map((p) => p.scaledWavelength),
        unseenAngles: pairs.map((p) => bit(p.unseenAngles)),
        compressedResolution: pairs.map((p) => bit(p.compressedResolution)),
      },
    })),
  };
}

/**
 * The rows back, with every field where the engine puts it (server/engine/index.ts `analyse`: `methods` before
 * `decay`, each method's `pairs` after `effectiveBase`), so the expanded answer serialises to the engine's JSON byte
 * for byte: the server keeps an answer in one form and derives the other from it (analyses.kept.ts).
 */
export function expandAnalysis(packed: AnalysisColumnsResponse): AnalysisResponse {
  const { form: _form, pairColumns: common, methods, decay, ...rest } = packed;
  return {
    ...rest,
    methods: methods.map(({ pairColumns: own, method, params, attentionFactor, effectiveBase, ...after }) => ({
      method,
      params,
      attentionFactor,
      effectiveBase,
      pairs: common.invFreq.map((invFreq, i): PairResult => ({
        index: i,
        invFreq,
        scaledInvFreq: own.scaledInvFreq[i],
        wavelength: common.wavelength[i],
        scaledWavelength: own.scaledWavelength[i],
        rotationsInTrainedWindow: common.rotationsInTrainedWindow[i],
        band: common.band[i],
        exceedsTrainedWindow: common.exceedsTrainedWindow[i] === 1,
        unseenAngles: own.unseenAngles[i] === 1,
        compressedResolution: own.compressedResolution[i] === 1,
      })),
      ...after,
    })),
    decay,
  };
}
