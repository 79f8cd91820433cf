import type { GroupRotarySpec } from "../../shared/layer-groups";
import type { MethodParams } from "../../shared/schemas/analysis";
import { runMethod } from "./methods";

/** A rotating layer group with the θ′ and attention factor its method gives it. */
export interface GroupRotary extends GroupRotarySpec {
  invFreq: number[];
  attentionFactor: number;
  /** the group's method with every default filled in, and its effective base: a compiler places these */
  params: MethodParams;
  effectiveBase: number | null;
}

/**
 * Runs each group's own method on its own base and rotary dimension. Every group shares the model's pre-training
 * length and the plan's target: a group left as trained (plain RoPE) has θ′ independent of both.
 */
export function rotateGroups(
  specs: readonly GroupRotarySpec[],
  trainedContext: number,
  targetContext: number,
): GroupRotary[] {
  return specs.map((s) => {
    const out = runMethod({ d: s.rotaryDim, base: s.base, trainedContext, targetContext }, s.method);
    return {
      ...s,
      invFreq: Array.from(out.invFreq),
      attentionFactor: out.attentionFactor,
      params: out.params,
      effectiveBase: out.effectiveBase,
    };
  });
}
