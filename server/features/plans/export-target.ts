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
  groupBlockCautions,
  groupsLackingSections,
  missingSectionKeys,
  type BlockCaution,
  type ScopedBlockCaution,
} from "../../../shared/frozen-block";

/** `?target=<id>&stage=<n>` of the export routes: a consumer to compile for, and a stage (1-based) instead of the final block. */
export interface ExportChoice {
  target?: TargetId;
  stage?: number;
}

/**
 * An imported profile's own config.json (see sourceConfigOf), or undefined, read at most once per call of the export
 * or plan page however many of its parts need it: `modelFile(deps, id)` makes the getter they share.
 */
export type ModelFile = () => Promise<Record<string, unknown> | undefined>;
export function modelFile(deps: AppDeps, modelId: number): ModelFile {
  let read: ReturnType<ModelFile> | undefined;
  return () => (read ??= findModelRow(deps.db, modelId).then((row) => (row ? sourceConfigOf(row) : undefined)));
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
export async function targetBlock(file: ModelFile, content: RevisionContent, choice: ExportChoice) {
  const { targetContext, method, result, request } = signedBlock(content, choice.stage);
  const config = choice.target ? await file() : undefined;
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
 * The stacks whose rigging of a block (compiled for the model's own file) keeps the sections, for one call: each
 * block's stacks are asked once, however many of the revision's blocks lack the sections (the plan target's request
 * serves both its own caution and the groups').
 */
function stacksAsker(file: ModelFile, content: RevisionContent) {
  const asked = new Map<number | undefined, Promise<TargetId[]>>();
  return (stage: number | undefined) => {
    let stacks = asked.get(stage);
    if (!stacks) {
      stacks = (async () => stacksKeepingSections({ ...signedBlock(content, stage).request, config: await file() }))();
      asked.set(stage, stacks);
    }
    return stacks;
  };
}
type StacksAsker = ReturnType<typeof stacksAsker>;

/** The cautions of one block's own config: the plan target's, or stage n's. */
async function ownBlockCautions(content: RevisionContent, stage: number | undefined, stacks: StacksAsker) {
  const { result } = signedBlock(content, stage);
  if (!missingSectionKeys(content.model, result.patch).length) return [];
  return frozenBlockCautions(content.model, result.patch, { stage, keepingTargets: await stacks(stage) });
}

/**
 * The cautions of a layered revision's group blocks (layerGroups[].config, and the ropeParametersByLayerType entries
 * built from them): every export of the revision carries them, whichever block it is for. Rigging for a stack compiles
 * every group with the plan target's request, so the stacks offered are that request's.
 */
async function groupCautions(content: RevisionContent, stacks: StacksAsker): Promise<BlockCaution[]> {
  const groups = content.results.groups;
  if (!groupsLackingSections(content.model, groups).length) return [];
  return groupBlockCautions(content.model, groups, await stacks(undefined));
}

/**
 * What is wrong with the blocks an export carries as they stand (shared/frozen-block.ts): its own block's (the plan
 * target's, or stage n's), then each layer group's. The stacks a caution offers are asked of every target: those whose
 * rigging, compiled for the model's own file, runs the plan and keeps the sections
 * (engine/targets/registry.ts targetsKeepingSections). Nothing is compiled unless a block lacks the sections.
 */
export async function blockCautions(
  file: ModelFile,
  content: RevisionContent,
  stage?: number,
): Promise<BlockCaution[]> {
  const stacks = stacksAsker(file, content);
  const [own, groups] = await Promise.all([ownBlockCautions(content, stage, stacks), groupCautions(content, stacks)]);
  return [...own, ...groups];
}

/**
 * The cautions of every block a revision signed, for the plan page: the plan target's first (stage null), then each
 * stage's, then each layer group's (stage null, `group` its kind), once each.
 */
export async function revisionBlockCautions(
  deps: AppDeps,
  modelId: number,
  content: RevisionContent,
): Promise<ScopedBlockCaution[]> {
  const scopes = [undefined, ...content.stages.map((_, i) => i + 1)];
  const stacks = stacksAsker(modelFile(deps, modelId), content);
  const [each, groups] = await Promise.all([
    Promise.all(scopes.map((stage) => ownBlockCautions(content, stage, stacks))),
    groupCautions(content, stacks),
  ]);
  return [
    ...each.flatMap((cautions, i) => cautions.map((c) => ({ stage: scopes[i] ?? null, ...c }))),
    ...groups.map((c) => ({ stage: null, ...c })),
  ];
}
