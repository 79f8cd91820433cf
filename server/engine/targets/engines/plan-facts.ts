import type { MethodParams, ParamsOf } from "../../../../shared/schemas/analysis";
import type { CompileInput } from "../types";

/**
 * The plan's method with every default filled in, as the engine ran it once for the export (PlanRotary), plus the base the result corresponds to when
 * the method only changes the base. The engine's own run is the reference: a compiler writes what the plan means,
 * never a default of its own.
 */
export interface ResolvedPlan {
  params: MethodParams;
  /** the request as the user gave it: tells an explicit attention factor from a computed one */
  requested: MethodParams;
  effectiveBase: number | null;
  d: number;
  base: number;
  trained: number;
  target: number;
}

export function resolvePlan(input: CompileInput): ResolvedPlan {
  const { plan } = input;
  return {
    params: plan.params,
    requested: input.method,
    effectiveBase: plan.effectiveBase,
    d: plan.rotaryDim,
    base: plan.base,
    trained: plan.trainedContext,
    target: plan.targetContext,
  };
}

/** The filled parameters of method `id` (a mismatch is a compiler bug, not bad input). */
export function paramsOf<K extends MethodParams["method"]>(p: ResolvedPlan, id: K): ParamsOf<K> {
  if (p.params.method !== id) throw new Error(`expected ${id} parameters, got ${p.params.method}`);
  return p.params as ParamsOf<K>;
}

/** The attention factor the plan asks for explicitly (a value, or the mscale pair), else null: g(s) is every engine's default. */
export function explicitYarnAttention(p: ResolvedPlan): number | null {
  const req = p.requested as ParamsOf<"yarn">;
  const filled = paramsOf(p, "yarn");
  if (req.attentionFactor !== undefined) return req.attentionFactor;
  if (req.mscale && req.mscaleAllDim) return filled.attentionFactor ?? null;
  return null;
}

/** Head dimension the way the serving engines read it: `head_dim` when the config has one, else hidden ÷ heads. */
export function headSize(config: Record<string, unknown>): number {
  const hd = config.head_dim;
  if (typeof hd === "number" && hd > 0) return hd;
  const hidden = config.hidden_size;
  const heads = config.num_attention_heads;
  if (typeof hidden !== "number" || typeof heads !== "number" || heads <= 0) {
    throw new Error("config.json has neither head_dim nor hidden_size and num_attention_heads");
  }
  return Math.floor(hidden / heads);
}

/** The factor the engine ran with (it fills the default s = target ÷ trained; the type keeps it optional). */
export const factorOf = (p: ResolvedPlan): number => (p.params as { factor?: number }).factor ?? p.target / p.trained;
