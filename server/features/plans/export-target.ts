import type { AppDeps } from "../../deps";
import { Invalid } from "../../platform/errors";
import { exportPlan, type TargetId } from "../../engine/targets";
import { rotaryShapeOf } from "../../../shared/profile-shapes";
import { groupRotarySpecs } from "../../../shared/layer-groups";
import { findModelRow, sourceConfigOf } from "../models";
import type { RevisionContent } from "./revision-content";
import { engineMethod } from "../../../shared/lineage";

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
 * The block an export carries: the final target's, or stage n's (each stage has its own block), with its fingerprint,
 * and when a target is named that target's artifact, read-back and conformance. The revision's frozen model snapshot
 * decides the numbers; the profile's imported file, if any, is only the config the patch is laid on.
 */
export async function targetBlock(deps: AppDeps, modelId: number, content: RevisionContent, choice: ExportChoice) {
  let targetContext = content.targetContext;
  let method = content.method;
  let result = content.results.final;
  if (choice.stage !== undefined) {
    const count = content.stages.length;
    if (choice.stage > count) {
      throw new Invalid(`this revision has ${count} stage${count === 1 ? "" : "s"}`, {
        stage: count ? `between 1 and ${count}` : "this revision has no stages",
      });
    }
    const stage = content.stages[choice.stage - 1];
    [targetContext, method, result] = [stage.targetContext, stage.method, content.results.stages[choice.stage - 1]];
  }
  const config = choice.target ? await sourceConfig(deps, modelId) : undefined;
  // As consumers read it: a plan from the served length exports its factors over the pre-trained length.
  method = engineMethod(content, method);
  const out = exportPlan({
    model: rotaryShapeOf(content.model),
    config,
    targetContext,
    method,
    targets: choice.target ? [choice.target] : [],
    groups: groupRotarySpecs(content.model, method, content.groupMethods),
  });
  return {
    targetContext,
    method,
    config: result.patch,
    attentionFactor: result.attentionFactor,
    fingerprint: out.fingerprint,
    target: out.targets[0],
  };
}
