import type { MethodParams, ModelShape } from "../../../shared/schemas/analysis";
import { rotaryDimension } from "../../../shared/schemas/analysis";
import { runMethod } from "../methods";
import { rotaryFingerprint } from "../fingerprint";
import { rotateGroups } from "../group-rotary";
import type { GroupRotarySpec } from "../../../shared/layer-groups";
import type { MethodContext } from "../types";
import type { CompileInput, PlanRun, TargetId } from "./types";
import { TARGET_IDS } from "./types";
import { exportForTargets, targetsKeepingSections, type TargetExport } from "./registry";

/**
 * config.json as the open config format spells a profile, for models that were not imported from a file (and as the
 * base an imported file's own keys are laid over). hidden_size falls back to head_dim × heads, so a reader that
 * divides it back (a consumer that ignores head_dim) gets the same dimension.
 */
export function configOfShape(m: ModelShape): Record<string, unknown> {
  const heads = m.attentionHeads ?? 1;
  const config: Record<string, unknown> = {
    hidden_size: m.hiddenSize ?? m.headDim * heads,
    num_attention_heads: heads,
    head_dim: m.headDim,
    rope_theta: m.ropeTheta,
    max_position_embeddings: m.trainedContext,
  };
  if (m.kvHeads !== undefined) config.num_key_value_heads = m.kvHeads;
  if (m.layers !== undefined) config.num_hidden_layers = m.layers;
  if (m.partialRotaryFactor !== undefined && m.partialRotaryFactor !== 1)
    config.partial_rotary_factor = m.partialRotaryFactor;
  return config;
}

export interface PlanExport {
  invFreq: number[];
  attentionFactor: number;
  rotaryDim: number;
  fingerprint: string;
  targets: TargetExport[];
}

/**
 * The plan's own θ′, attention factor and fingerprint, and each requested target's artifact, read-back and conformance.
 * A layered model's `groups` make the fingerprint and every target's conformance cover each rotating group.
 * `config` is the model's config.json when known (an imported file); the profile's values are laid over it.
 */
export interface PlanExportRequest {
  model: ModelShape;
  config?: Record<string, unknown>;
  targetContext: number;
  method: MethodParams;
  targets?: readonly TargetId[];
  /** a layered model's rotating groups with their methods (shared/layer-groups.ts groupRotarySpecs) */
  groups?: readonly GroupRotarySpec[];
}

/** What every target's compiler is handed for this request: the plan's one run and the model's config. */
function compileInput(p: PlanExportRequest): {
  input: CompileInput;
  d: number;
  groups?: ReturnType<typeof rotateGroups>;
} {
  const d = rotaryDimension(p.model);
  if (d === null) throw new RangeError("rotary dimension must be a positive even integer (validate the model first)");
  const ctx = { d, base: p.model.ropeTheta, trainedContext: p.model.trainedContext, targetContext: p.targetContext };
  const groups = p.groups?.length ? rotateGroups(p.groups, p.model.trainedContext, p.targetContext) : undefined;
  const plan: PlanRun = { ...planRotary(ctx, p.method), ...(groups ? { groups } : {}) };
  return { input: { config: { ...(p.config ?? {}), ...configOfShape(p.model) }, method: p.method, plan }, d, groups };
}

export function exportPlan(p: PlanExportRequest): PlanExport {
  const { input, d, groups } = compileInput(p);
  const plan = input.plan;
  return {
    invFreq: plan.invFreq,
    attentionFactor: plan.attentionFactor,
    rotaryDim: d,
    fingerprint: rotaryFingerprint(
      groups ?? [{ rotaryDim: d, attentionFactor: plan.attentionFactor, invFreq: plan.invFreq }],
    ),
    targets: exportForTargets(input, p.targets ?? TARGET_IDS),
  };
}

/** The targets (all, or `p.targets`) whose rigging of this plan runs it and keeps the model's multimodal sections. */
export const stacksKeepingSections = (p: PlanExportRequest): TargetId[] =>
  targetsKeepingSections(compileInput(p).input, p.targets ?? TARGET_IDS);

/**
 * The engine's one run of the plan's method for an export: every target's compiler reads its filled parameters from
 * here instead of running the method again.
 */
export function planRotary(ctx: MethodContext, method: MethodParams): PlanRun {
  const out = runMethod(ctx, method);
  return {
    rotaryDim: ctx.d,
    base: ctx.base,
    trainedContext: ctx.trainedContext,
    targetContext: ctx.targetContext,
    invFreq: Array.from(out.invFreq),
    attentionFactor: out.attentionFactor,
    params: out.params,
    effectiveBase: out.effectiveBase,
  };
}
