import { inverseFrequencies } from "../../engine/frequencies";
import { supportedLength } from "../../engine/base-bound";
import { smallestSupportingBase } from "../../engine/base-search";
import type { BaseBoundQuery, BaseBoundResponse, BoundProgress } from "../../../shared/schemas/bounds";

/** The search itself, synchronous; runs inside the worker thread (bounds.worker.ts), never on the request thread. */
export function computeBaseBound(query: BaseBoundQuery, onProgress: (p: BoundProgress) => void): BaseBoundResponse {
  if (query.kind === "supportedLength") {
    const theta = inverseFrequencies(query.rotaryDim, query.base);
    const found = supportedLength(theta, query.maxLength, (position) =>
      onProgress({ position, maxLength: query.maxLength }),
    );
    return { supportedLength: found, maxLength: query.maxLength };
  }
  const result = smallestSupportingBase(query.rotaryDim, query.targetContext, query.grid, {
    onProgress: (candidatesExamined, total) => onProgress({ candidatesExamined, total }),
  });
  return { ...result, grid: query.grid };
}
