import type { CompileInput, CompileResult, ExportTarget, TargetArtifact, TargetId } from "./types";
import { TARGET_IDS } from "./types";
import { conformance, type Conformance } from "./conformance";
import { coverGroups } from "./group-conformance";
import { transformersV4EarlyTarget } from "./transformers-v4-early";
import { transformersV4Target } from "./transformers-v4";
import { transformersV5Target } from "./transformers-v5";
import { vllmTarget } from "./vllm";
import { sglangTarget } from "./sglang";
import { llamaCppTarget } from "./llama-cpp";

/** Every consumer Ropewalk compiles for: adding a target is one entry here and one file with its reader. */
export const TARGETS: Record<TargetId, ExportTarget> = {
  "transformers-v4-early": transformersV4EarlyTarget,
  "transformers-v4": transformersV4Target,
  "transformers-v5": transformersV5Target,
  vllm: vllmTarget,
  sglang: sglangTarget,
  "llama-cpp": llamaCppTarget,
};

/** The running length the plan's frequencies are shown at: dynamic scaling's own inference length, else the target. */
export const runningLength = (input: CompileInput) =>
  input.method.method === "dynamic"
    ? (input.method.sequenceLength ?? input.plan.targetContext)
    : input.plan.targetContext;

export interface TargetExport {
  id: TargetId;
  label: string;
  artifact: TargetArtifact | null;
  readBack: { invFreq: number[]; attentionFactor: number } | null;
  conformance: Conformance;
}

/**
 * Compiles the plan for each target, reads the artifact back with that target's reader (applied to the model's own
 * config) and compares the reading with the plan. A compiler or reader that throws counts as "unsupported" with its message.
 */
export function exportForTargets(input: CompileInput, ids: readonly TargetId[] = TARGET_IDS): TargetExport[] {
  return ids.map((id) => {
    const target = TARGETS[id];
    // A compiler that throws on this model's config (say, one whose GGUF would carry factor tensors no flag sets) marks
    // its own target unsupported, like a reader that throws; the other targets are still compiled.
    let compiled: CompileResult;
    try {
      compiled = target.compile(input);
    } catch (e) {
      compiled = {
        ok: false,
        cause: `it cannot compile this plan: ${e instanceof Error ? e.message : String(e)}`,
        workaround: "",
      };
    }
    const artifact = compiled.artifact ?? null;
    if (!artifact)
      return {
        id,
        label: target.label,
        artifact,
        readBack: null,
        conformance: conformance(input.plan, null, compiled),
      };
    try {
      const reading = target.read(input.config, artifact, runningLength(input));
      return {
        id,
        label: target.label,
        artifact,
        readBack: { invFreq: reading.invFreq, attentionFactor: reading.attentionFactor },
        conformance: coverGroups(input.plan, reading, conformance(input.plan, reading, compiled)),
      };
    } catch (e) {
      const cause = `its reader refuses the artifact: ${e instanceof Error ? e.message : String(e)}`;
      return {
        id,
        label: target.label,
        artifact,
        readBack: null,
        conformance: conformance(input.plan, null, { ok: false, cause, workaround: "" }),
      };
    }
  });
}
