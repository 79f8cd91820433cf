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
import { applyMergePatch } from "./merge-patch";
import { argsOf, flagValue } from "./engines/launch-text";
import { ggufArch, key } from "./engines/gguf";
import { sectionKeysOf } from "../../../shared/mrope-axes";
import { isObj } from "../../../shared/json-values";

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

type Sections = Record<string, unknown> | null;
type Config = Record<string, unknown>;

/** The multimodal section keys of config.json once a merge patch is applied (RFC 7396), in the block `pick` reads. */
const merged = (pick: (c: Config) => unknown) => (config: Config, a: TargetArtifact) =>
  sectionKeysOf(pick(applyMergePatch(config, a.content) as Config));

/** Top-level keys of the config replaced whole by the JSON after `flag` (`config.update(...)`), then `pick`'s block. */
const overridden = (flag: string, pick: (c: Config) => unknown) => (config: Config, a: TargetArtifact) => {
  const text = flagValue(argsOf(a), flag);
  const overrides: unknown = text === undefined ? {} : JSON.parse(text);
  return sectionKeysOf(pick({ ...config, ...(isObj(overrides) ? overrides : {}) }));
};

/**
 * The sections v5 runs with: its block is `rope_scaling` when present and non-empty, else `rope_parameters`
 * (hf/read-v5.ts cites where). Nested by layer type (keys among the config's `layer_types`, standardize_rope_params'
 * "Case 2", server/engine/layer-nesting.ts), each layer type's rotary is built from its own entry, so the sections are
 * held only when every entry holds them (a layered multimodal v5 config read through that rule; no such published
 * model was read); the top level of a nested dict holds no block of its own.
 */
function v5Sections(c: Config): unknown {
  const source = isObj(c.rope_scaling) && Object.keys(c.rope_scaling).length ? c.rope_scaling : c.rope_parameters;
  const layerTypes = Array.isArray(c.layer_types) ? c.layer_types.map(String) : [];
  const nested = isObj(source) ? Object.keys(source).filter((k) => layerTypes.includes(k)) : [];
  if (!nested.length) return source;
  const each = nested.map((t) => sectionKeysOf((source as Config)[t]));
  return each.every((x) => x !== null) ? each[0] : null;
}

/**
 * Where each consumer holds a model's multimodal sections once our artifact is applied: the sections it runs with, or
 * null when the artifact leaves it none. One entry per target, so a new target must say; the signed-block caution
 * (shared/frozen-block.ts) names the targets from here, never from a list of its own.
 * - 4.x transformers reads `rope_scaling`: models/qwen2_vl/modeling_qwen2_vl.py at 00b676f8,
 *   `self.rope_scaling["mrope_section"]`; v5 takes `rope_scaling or rope_parameters` (RotaryEmbeddingConfigMixin,
 *   v5 line, read through a stored copy; server/features/models/config-import.ts scaledBlock cites the same line),
 *   per layer type when nested (v5Sections);
 * - vLLM and SGLang apply their JSON flag as `config.update(...)`, top-level keys replaced whole (vllm.ts and sglang.ts
 *   readers cite where); vLLM's get_rope takes `rope_parameters` before `rope_scaling` as vllm.ts's compile reads them;
 * - llama.cpp runs the GGUF's `<arch>.rope.dimension_sections` (llama-cpp.ts, SECTIONED_ARCHS), which the artifact's
 *   metadata states for the architecture it converts as.
 */
export const SECTIONS_WITH_ARTIFACT: Record<TargetId, (config: Config, artifact: TargetArtifact) => Sections> = {
  "transformers-v4-early": merged((c) => c.rope_scaling),
  "transformers-v4": merged((c) => c.rope_scaling),
  "transformers-v5": merged(v5Sections),
  vllm: overridden("--hf-overrides", (c) => c.rope_parameters ?? c.rope_scaling),
  sglang: overridden("--json-model-override-args", (c) => c.rope_scaling),
  "llama-cpp": (config, a) => {
    const metadata = a.content.metadata;
    const sections = isObj(metadata) ? metadata[key(ggufArch(config), "rope.dimension_sections")] : undefined;
    return Array.isArray(sections) ? { mrope_section: sections } : null;
  },
};

/**
 * The targets whose rigging of this plan, compiled for this model, runs the plan (conformance exact or equivalent) and
 * keeps the model's multimodal sections (SECTIONS_WITH_ARTIFACT): the ways out the signed-block caution names.
 */
export function targetsKeepingSections(input: CompileInput, ids: readonly TargetId[] = TARGET_IDS): TargetId[] {
  return exportForTargets(input, ids)
    .filter(
      (t) =>
        t.artifact !== null &&
        (t.conformance.status === "exact" || t.conformance.status === "equivalent") &&
        SECTIONS_WITH_ARTIFACT[t.id](input.config, t.artifact) !== null,
    )
    .map((t) => t.id);
}
