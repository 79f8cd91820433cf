import type { ConfigPatch, MethodId, ParamsOf } from "../../shared/schemas/analysis";

/** What every method sees. trainedContext is the original length L for every method. */
export interface MethodContext {
  /** rotary dimension (even) */
  d: number;
  /** original base b (rope_theta) */
  base: number;
  trainedContext: number;
  targetContext: number;
  /**
   * The model's multimodal sections, when it has them: no number depends on them, but the config patch carries them
   * (methods/common.ts), since the model's attention reads them on every step.
   */
  mropeSection?: readonly number[];
  mropeInterleaved?: boolean;
}

/** One method's answer: scaled inverse frequencies θ'_i, the cos/sin multiplier a, and its config patch. */
export interface MethodOutput<K extends MethodId = MethodId> {
  invFreq: Float64Array | number[];
  attentionFactor: number;
  /** the request's parameters with every default filled in */
  params: ParamsOf<K>;
  ropeScaling: ConfigPatch;
  /** base the result corresponds to when the method only changes the base, else null */
  effectiveBase: number | null;
  /** plain-language cautions about the export (loader behaviour etc.) */
  notes: string[];
}

export type MethodFn<K extends MethodId = MethodId> = (ctx: MethodContext, params: ParamsOf<K>) => MethodOutput<K>;

/** The table type: one function per method id, each taking its own member of the params union. */
export type MethodTable = { [K in MethodId]: MethodFn<K> };
