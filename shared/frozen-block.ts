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

/** The per-stack exports whose rigging keeps the sections (server/engine/targets: hf/compile.ts, vllm, sglang). */
const KEEPING_TARGETS = ["transformers-v4", "transformers-v5", "vllm", "sglang"] as const;

type SectionedModel = { mropeSection?: readonly number[]; mropeInterleaved?: boolean };

/** The section keys the model has that the signed block lacks (none for a model without sections). */
export function missingSectionKeys(model: SectionedModel, patch: { rope_scaling: unknown }): string[] {
  if (!model.mropeSection?.length) return [];
  const block = patch.rope_scaling;
  const has = (k: string) => typeof block === "object" && block !== null && k in block;
  const wanted: readonly string[] = model.mropeInterleaved ? MROPE_KEYS : ["mrope_section"];
  return wanted.filter((k) => !has(k));
}

/** Which signed block: the plan target's (the export without `?stage`), or stage n's (`?stage=n`). */
export interface BlockScope {
  stage?: number;
}

export function frozenBlockCautions(
  model: SectionedModel,
  patch: { rope_scaling: unknown },
  { stage }: BlockScope = {},
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
  return [
    {
      code: FROZEN_CONFIG_LACKS_SECTIONS,
      message:
        `${block} lacks ${keys}, which the model reads on every step: ${effect}. It was signed before ` +
        `signed blocks carried multimodal sections, and stays as signed. Export it with ${query} ` +
        `(${KEEPING_TARGETS.join(", ")}), whose rigging keeps the sections, or draft a new revision, whose signed ` +
        "block carries them.",
    },
  ];
}

/** One signed block's caution, for the plan page: `stage` null for the plan target's block. */
export interface ScopedBlockCaution extends BlockCaution {
  stage: number | null;
}

/**
 * The cautions of every block a revision signed, the plan target's first and then each stage's, in the words each
 * block's export carries (`?stage=n` for a stage's).
 */
export function revisionBlockCautions(content: {
  model: SectionedModel;
  results: { final: { patch: { rope_scaling: unknown } }; stages: readonly { patch: { rope_scaling: unknown } }[] };
}): ScopedBlockCaution[] {
  return [
    ...frozenBlockCautions(content.model, content.results.final.patch).map((c) => ({ stage: null, ...c })),
    ...content.results.stages.flatMap((s, i) =>
      frozenBlockCautions(content.model, s.patch, { stage: i + 1 }).map((c) => ({ stage: i + 1, ...c })),
    ),
  ];
}
