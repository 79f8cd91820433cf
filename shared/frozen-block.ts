import { MROPE_KEYS } from "./mrope-axes";

/**
 * Cautions about a revision's signed config block (its frozen `patch`), shown with the export envelope and on the plan
 * page. Revisions signed before engine 1.1 froze the block of a model with multimodal sections without them (a new
 * base wrote `rope_scaling: null`); their stored content and hash stay as signed, so the export says so instead.
 */
export interface BlockCaution {
  /** stable, for scripts: frozen_config_lacks_sections */
  code: string;
  /** a layer group's block: its kind (the export's layerGroups[].kind); absent for the plan target's or a stage's */
  group?: string;
  message: string;
}

export const FROZEN_CONFIG_LACKS_SECTIONS = "frozen_config_lacks_sections";

type SectionedModel = { mropeSection?: readonly number[]; mropeInterleaved?: boolean };

/** The section keys the model has that the signed block lacks (none for a model without sections). */
export function missingSectionKeys(model: SectionedModel, patch: { rope_scaling: unknown }): string[] {
  if (!model.mropeSection?.length) return [];
  const block = patch.rope_scaling;
  const has = (k: string) => typeof block === "object" && block !== null && k in block;
  const wanted: readonly string[] = model.mropeInterleaved ? MROPE_KEYS : ["mrope_section"];
  return wanted.filter((k) => !has(k));
}

/**
 * A layered model's group block (the export's `layerGroups[].config`, one per kind): `rotates` when the group has
 * rotary positions, so its block is also the group's `ropeParametersByLayerType` entry (server/engine/layer-nesting.ts
 * gives no_rope layers none).
 */
export interface GroupScope {
  kind: string;
  rotates: boolean;
}

/**
 * Which signed block: the plan target's (the export without `?stage`), stage n's (`?stage=n`), or a layer group's
 * (every export of a layered revision carries each group's block), and the stacks whose rigging of it keeps the
 * sections: asked of the targets themselves (server/engine/targets/registry.ts targetsKeepingSections), never listed
 * here.
 */
export interface BlockScope {
  stage?: number;
  group?: GroupScope;
  keepingTargets: readonly string[];
}

/** How the caution names its block, and the export that rigs it for a stack. */
function blockWords(stage: number | undefined, group: GroupScope | undefined) {
  if (group) {
    const where = group.rotates
      ? `(layerGroups' config and ropeParametersByLayerType.${group.kind})`
      : "(layerGroups' config)";
    return { block: `The ${group.kind} layer group's signed block ${where}`, query: "?target=<stack>" };
  }
  if (stage === undefined) return { block: "This signed block", query: "?target=<stack>" };
  return { block: `Stage ${stage}'s signed block`, query: `?stage=${stage}&target=<stack>` };
}

export function frozenBlockCautions(
  model: SectionedModel,
  patch: { rope_scaling: unknown },
  { stage, group, keepingTargets }: BlockScope,
): BlockCaution[] {
  const missing = missingSectionKeys(model, patch);
  if (!missing.length) return [];
  const keys = missing.map((k) => `"${k}"`).join(" and ");
  const effect =
    patch.rope_scaling === null
      ? "its rope_scaling is null, so applying it deletes the sections"
      : "applying it as a whole rope_scaling block drops them";
  const { block, query } = blockWords(stage, group);
  const wayOut = keepingTargets.length
    ? `Export it with ${query} (${keepingTargets.join(", ")}), whose rigging keeps the sections, or draft a new ` +
      "revision, whose signed block carries them."
    : "As this model and plan stand, no stack's rigging keeps them for this plan either: draft a new revision, " +
      "whose signed block carries them.";
  return [
    {
      code: FROZEN_CONFIG_LACKS_SECTIONS,
      ...(group ? { group: group.kind } : {}),
      message:
        `${block} lacks ${keys}, which the model reads on every step: ${effect}. It was signed before ` +
        `signed blocks carried multimodal sections, and stays as signed. ${wayOut}`,
    },
  ];
}

/** One signed block's caution, for the plan page: `stage` null for the plan target's block. */
export interface ScopedBlockCaution extends BlockCaution {
  stage: number | null;
}

/** A layered revision's group blocks as the export hands them out (server/features/plans/group-export.ts). */
export interface SignedGroup {
  kind: string;
  /** null for a group without rotary positions (no_rope) */
  ropeTheta: number | null;
  patch: { rope_scaling: unknown };
}

/** The group blocks that lack the model's sections: the same rule as every other signed block. */
export const groupsLackingSections = (model: SectionedModel, groups: readonly SignedGroup[] | undefined) =>
  (groups ?? []).filter((g) => missingSectionKeys(model, g.patch).length > 0);

/** One caution per group block that lacks the sections, naming the group's kind. */
export function groupBlockCautions(
  model: SectionedModel,
  groups: readonly SignedGroup[] | undefined,
  keepingTargets: readonly string[],
): BlockCaution[] {
  // frozenBlockCautions answers [] for a group whose block keeps the sections
  return (groups ?? []).flatMap((g) =>
    frozenBlockCautions(model, g.patch, { group: { kind: g.kind, rotates: g.ropeTheta !== null }, keepingTargets }),
  );
}
