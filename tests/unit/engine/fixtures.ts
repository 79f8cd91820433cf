import type { MethodId, ParamsOf } from "../../../shared/schemas/analysis";
import { METHOD_CATALOG, METHOD_IDS } from "../../../shared/methods";
import type { MethodContext } from "../../../server/engine";

/** A Llama-2-like shape (d = 128, b = 10 000, L = 4096) extended 8×. */
export const CTX: MethodContext = { d: 128, base: 10_000, trainedContext: 4096, targetContext: 32_768 };

type Samples = { [K in MethodId]: ParamsOf<K> };

/** One sample per method, the catalog entry's example for d/2 pairs: a new entry brings its sample with it. */
export const samplesFor = (d: number): Samples =>
  Object.fromEntries(METHOD_IDS.map((id) => [id, METHOD_CATALOG[id].example(d / 2)])) as Samples;

export const SAMPLE: Samples = samplesFor(CTX.d);
