import { MROPE_KEYS } from "./mrope-axes";

/**
 * Cautions about a revision's signed config block (its frozen `patch`), shown with the export envelope and on the plan
 * page. Revisions signed before engine 1.1 froze the block of a model with multimodal sections without them (a new
 * base wrote `rope_scaling: null`); their stored content and hash stay as signed, so the export says so instead.
 */
export interface BlockCaution {
  /** stable, for scripts: frozen_config_lacks_sections */
  code: string;
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
 * Which signed block: the plan target's (the export without `?stage`), or stage n's (`?stage=n`), and the stacks whose
 * rigging of it keeps the sections: asked of the targets themselves (server/engine/targets/registry.ts
 * targetsKeepingSections), never listed here.
 */
export interface BlockScope {
  stage?: number;
  keepingTargets: readonly string[];
}

export function frozenBlockCautions(
  model: SectionedModel,
  patch: { rope_scaling: unknown },
  { stage, keepingTargets }: BlockScope,
): BlockCaution[] {
  const missing = missingSectionKeys(model, patch);
  if (!missing.length) return [];
  const keys = missing.map((k) => `"${k}"`).join(" and ");
  const effect =
    patch.rope_scaling === null
      ? "its rope_scaling is null, so applying it deletes the sections"
      : "applying it as a whole rope_scaling block drops them";
  const block = stage === undefined ? "This signed block" : `Stage ${stage}'s signed block`;
  const query = stage === undefined ? "?target=<stack>" : `?stage=${stage}&target=<stack>`;
  const wayOut = keepingTargets.length
    ? `Export it with ${query} (${keepingTargets.join(", ")}), whose rigging keeps the sections, or draft a new ` +
      "revision, whose signed block carries them."
    : "As this model and plan stand, no stack's rigging keeps them for this plan either: draft a new revision, " +
      "whose signed block carries them.";
  return [
    {
      code: FROZEN_CONFIG_LACKS_SECTIONS,
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
