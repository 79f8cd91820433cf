import type { AppDeps } from "../../deps";
import { Invalid } from "../../platform/errors";
import { exportPlan, stacksKeepingSections, type TargetId } from "../../engine/targets";
import { rotaryShapeOf } from "../../../shared/profile-shapes";
import { groupRotarySpecs } from "../../../shared/layer-groups";
import { findModelRow, sourceConfigOf } from "../models";
import type { RevisionContent } from "./revision-content";
import { engineMethod } from "../../../shared/lineage";
import {
  frozenBlockCautions,
  missingSectionKeys,
  type BlockCaution,
  type ScopedBlockCaution,
} from "../../../shared/frozen-block";

/** `?target=<id>&stage=<n>` of the export routes: a consumer to compile for, and a stage (1-based) instead of the final block. */
export interface ExportChoice {
  target?: TargetId;
  stage?: number;
}

/** An imported profile's own config.json (see sourceConfigOf), or undefined. */
async function sourceConfig(deps: AppDeps, modelId: number): Promise<Record<string, unknown> | undefined> {
  const row = await findModelRow(deps.db, modelId);
  return row ? sourceConfigOf(row) : undefined;
}

/**
 * The block an export signed: the final target's, or stage n's (each stage has its own block), with the method as
 * consumers read it and the engine's request for it (the revision's frozen model snapshot decides the numbers).
 */
function signedBlock(content: RevisionContent, stage: number | undefined) {
  let targetContext = content.targetContext;
  let method = content.method;
  let result = content.results.final;
  if (stage !== undefined) {
    const count = content.stages.length;
    if (stage > count) {
      throw new Invalid(`this revision has ${count} stage${count === 1 ? "" : "s"}`, {
        stage: count ? `between 1 and ${count}` : "this revision has no stages",
      });
    }
    const s = content.stages[stage - 1];
    [targetContext, method, result] = [s.targetContext, s.method, content.results.stages[stage - 1]];
  }
  // As consumers read it: a plan from the served length exports its factors over the pre-trained length.
  method = engineMethod(content, method);
  return {
    targetContext,
    method,
    result,
    request: {
      model: rotaryShapeOf(content.model),
      targetContext,
      method,
      groups: groupRotarySpecs(content.model, method, content.groupMethods),
    },
  };
}

/**
 * The block an export carries: the final target's, or stage n's, with its fingerprint, and when a target is named that
 * target's artifact, read-back and conformance. The profile's imported file, if any, is only the config the patch is
 * laid on.
 */
export async function targetBlock(deps: AppDeps, modelId: number, content: RevisionContent, choice: ExportChoice) {
  const { targetContext, method, result, request } = signedBlock(content, choice.stage);
  const config = choice.target ? await sourceConfig(deps, modelId) : undefined;
  const out = exportPlan({ ...request, config, targets: choice.target ? [choice.target] : [] });
  return {
    targetContext,
    method,
    config: result.patch,
    attentionFactor: result.attentionFactor,
    fingerprint: out.fingerprint,
    target: out.targets[0],
  };
}

/**
 * What is wrong with a signed block as it stands (shared/frozen-block.ts), for its export and the plan page. The stacks
 * its caution offers are asked of every target: those whose rigging of this block, compiled for the model's own file,
 * runs it and keeps the sections (engine/targets/registry.ts targetsKeepingSections).
 */
export async function blockCautions(
  deps: AppDeps,
  modelId: number,
  content: RevisionContent,
  stage?: number,
): Promise<BlockCaution[]> {
  const { result, request } = signedBlock(content, stage);
  if (!missingSectionKeys(content.model, result.patch).length) return [];
  const keepingTargets = stacksKeepingSections({ ...request, config: await sourceConfig(deps, modelId) });
  return frozenBlockCautions(content.model, result.patch, { stage, keepingTargets });
}

/** The cautions of every block a revision signed, the plan target's first (stage null), then each stage's. */
export async function revisionBlockCautions(
  deps: AppDeps,
  modelId: number,
  content: RevisionContent,
): Promise<ScopedBlockCaution[]> {
  const scopes = [undefined, ...content.stages.map((_, i) => i + 1)];
  const each = await Promise.all(scopes.map((stage) => blockCautions(deps, modelId, content, stage)));
  return each.flatMap((cautions, i) => cautions.map((c) => ({ stage: scopes[i] ?? null, ...c })));
}
