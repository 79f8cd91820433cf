import type { CompileResult, TargetArtifact } from "../types";

/**
 * vLLM and SGLang build a multimodal rotary (one position axis per section) only for the rope types their get_rope
 * lists; each engine's file names its list and the source it was read in. A block of any other type on a model with
 * sections runs one position axis, so the plan is refused for that engine with the reason and what to plan instead.
 */
export function unsectionedTypeRefusal(
  engine: string,
  sectionedTypes: readonly string[],
  ropeType: string,
  artifact: TargetArtifact,
): CompileResult | null {
  if (sectionedTypes.includes(ropeType)) return null;
  return {
    ok: false,
    cause: `${engine} builds multimodal sections only for rope_type ${sectionedTypes.join(" or ")}; a ${ropeType} block runs one position axis, so image and video tokens lose their height and width positions`,
    workaround: `for this model on ${engine}, plan with YaRN or a new base (NTK-aware, adjusted base)`,
    artifact,
  };
}
