import type { CompileInput, CompileResult, ExportTarget, TargetArtifact } from "./types";
import { explicitYarnAttention, factorOf, paramsOf, resolvePlan } from "./engines/plan-facts";
import { isObj } from "../../../shared/json-values";
import { launchArtifact } from "./engines/launch-text";
import { yarnMscale } from "./consumer-rope";
import {
  SECTIONED_ARCHS,
  configSections,
  convertedFreqFactors,
  ggufArch,
  ggufSections,
  key,
  type Metadata,
} from "./engines/gguf";
import { readLlamaCpp } from "./engines/llama-cpp-reader";

/**
 * llama.cpp (the GGUF runtime), read at ggml-org/llama.cpp master (docs/export-targets-engines.md). Artifact:
 * `{ args, metadata }`: flags for llama-server / llama-cli, and the same facts as GGUF metadata keys for a rewritten
 * file. `--override-kv <arch>.context_length` raises the training length the runtime checks n_ctx against, so it
 * neither warns nor (llama-server) caps the slot context at the old length.
 */
const fl = (n: number) => String(n);

function compileParts(input: CompileInput): { args: string[]; metadata: Metadata; unsupported?: [string, string] } {
  const p = resolvePlan(input);
  const arch = ggufArch(input.config);
  const { trained: L, target } = p;
  const args = ["-c", String(target), "--override-kv", `${key(arch, "context_length")}=int:${target}`];
  const metadata: Metadata = { [key(arch, "context_length")]: target };
  const plainBase = (base: number) => {
    args.push("--rope-scaling", "none", "--rope-freq-base", fl(base));
    Object.assign(metadata, { [key(arch, "rope.scaling.type")]: "none", [key(arch, "rope.freq_base")]: base });
  };
  switch (p.params.method) {
    case "default":
    case "ntk":
    case "base":
      plainBase(p.effectiveBase ?? p.base);
      return { args, metadata };
    case "dynamic":
      // The plan's base at its running length, held fixed: the closest a static base comes.
      plainBase(p.effectiveBase ?? p.base);
      return {
        args,
        metadata,
        unsupported: [
          "llama.cpp has no dynamic NTK scaling: its base is fixed when the context is made (llama-context.cpp)",
          `run the plan's base at ${paramsOf(p, "dynamic").sequenceLength} tokens as a fixed --rope-freq-base (the artifact does this); shorter prompts then also run the larger base`,
        ],
      };
    case "linear": {
      const s = factorOf(p);
      args.push("--rope-scaling", "linear", "--rope-scale", fl(s), "--rope-freq-base", fl(p.base));
      Object.assign(metadata, {
        [key(arch, "rope.scaling.type")]: "linear",
        [key(arch, "rope.scaling.factor")]: s,
        [key(arch, "rope.freq_base")]: p.base,
      });
      return { args, metadata };
    }
    case "yarn": {
      const y = paramsOf(p, "yarn");
      const explicit = explicitYarnAttention(p);
      // ggml multiplies the attention factor by 1 + 0.1·ln(1/freq_scale) itself (rope_yarn): pass the remainder.
      const attn = explicit === null ? 1 : explicit / yarnMscale(factorOf(p));
      args.push(
        ...["--rope-scaling", "yarn", "--rope-scale", fl(factorOf(p)), "--rope-freq-base", fl(p.base)],
        ...["--yarn-orig-ctx", String(L), "--yarn-ext-factor", "1.0", "--yarn-attn-factor", fl(attn)],
        ...["--yarn-beta-fast", fl(y.betaFast ?? 32), "--yarn-beta-slow", fl(y.betaSlow ?? 1)],
      );
      Object.assign(metadata, {
        [key(arch, "rope.scaling.type")]: "yarn",
        [key(arch, "rope.scaling.factor")]: factorOf(p),
        [key(arch, "rope.scaling.original_context_length")]: L,
        [key(arch, "rope.freq_base")]: p.base,
      });
      const unsupported: [string, string] | undefined =
        y.truncate === false
          ? [
              "llama.cpp always rounds YaRN's ramp ends to whole pairs (ggml_rope_yarn_corr_dims floors and ceils); truncate: false cannot be expressed",
              "plan with truncate on (the default), or serve with vLLM or SGLang, which read truncate",
            ]
          : undefined;
      return { args, metadata, unsupported };
    }
    case "llama3":
      return {
        args,
        metadata,
        unsupported: [
          "llama.cpp takes the llama3 divisors from the rope_freqs tensor convert_hf_to_gguf.py writes; no flag or metadata key sets them",
          `convert again from a config.json carrying this rope_scaling block and a top-level original_max_position_embeddings of ${L} (the converter reads the length there, default 8192)`,
        ],
      };
    case "longrope":
      return {
        args,
        metadata,
        unsupported: [
          "llama.cpp takes LongRoPE's per-pair factors from the rope_factors_long/short tensors the converter writes; no flag sets them",
          "convert again from a config.json carrying this longrope block",
        ],
      };
  }
}

/**
 * Multimodal sections in llama.cpp: the GGUF carries them (`rope.dimension_sections`, written by the converter), the
 * architecture fixes their layout (SECTIONED_ARCHS), and ggml's multi-section rope turns every pair through the same
 * rope_yarn as the one-axis rope — same freq_scale, ext_factor, attention factor and ramp ends from n_ctx_orig
 * (ggml/src/ggml-cpu/ops.cpp at 0049e3c, ggml_mrope_cache_init calls rope_yarn per pair with the section's position) —
 * so linear and YaRN apply to a sectioned model exactly as to a plain one. The artifact's metadata carries the sections
 * (a rewritten file keeps them); a model whose architecture runs no sections, or runs the other layout, is refused.
 */
function sectionRefusal(sections: ReturnType<typeof configSections>, arch: string): [string, string] | null {
  if (!sections) return null;
  const layout = SECTIONED_ARCHS[arch];
  const wanted = sections.interleaved ? "interleaved" : "contiguous";
  const runs = Object.entries(SECTIONED_ARCHS)
    .map(([a, l]) => `${a} (${l})`)
    .join(", ");
  if (!layout) {
    return [
      `llama.cpp runs multimodal sections only for the architectures it gives a multi-section rope (${runs}); this model converts as ${arch}, which turns every pair by one position axis, so image and video tokens lose their height and width positions`,
      "serve this model with vLLM or SGLang, which read mrope_section from the config",
    ];
  }
  if (layout !== wanted) {
    return [
      `llama.cpp fixes the section layout by architecture: ${arch} runs ${layout} sections, and this model's config declares ${wanted} ones (mrope_interleaved ${sections.interleaved})`,
      "serve this model with vLLM or SGLang, which read mrope_interleaved from the config",
    ];
  }
  return null;
}

function compile(input: CompileInput): CompileResult {
  const { args, metadata, unsupported } = compileParts(input);
  const method = input.method.method;
  if (method === "llama3" || method === "longrope") {
    return { ok: false, cause: unsupported![0], workaround: unsupported![1] };
  }
  const arch = ggufArch(input.config);
  const sections = configSections(input.config);
  if (sections) metadata[key(arch, "rope.dimension_sections")] = ggufSections(sections.section);
  const artifact = launchArtifact('llama-server -m "$MODEL_GGUF"', args, { metadata });
  if (unsupported) return { ok: false, cause: unsupported[0], workaround: unsupported[1], artifact };
  const refusedSections = sectionRefusal(sections, arch);
  if (refusedSections) return { ok: false, cause: refusedSections[0], workaround: refusedSections[1], artifact };
  // A model converted from a llama3 config carries rope_freqs: ggml divides by it on top of any flag.
  if (isObj(input.config.rope_scaling) && convertedFreqFactors(input.config, input.plan.rotaryDim, input.plan.base)) {
    return {
      ok: false,
      cause:
        "the converted GGUF carries the model's own llama3 rope_freqs tensor, which llama.cpp applies on top of these flags",
      workaround: "convert again from a config.json without the llama3 rope_scaling block, then use these flags",
      artifact,
    };
  }
  return { ok: true, artifact };
}

export const llamaCppTarget: ExportTarget = {
  id: "llama-cpp",
  label: "llama.cpp (GGUF flags and metadata)",
  consumer: "llama.cpp",
  versions: [
    "master (common/arg.cpp, src/llama-context.cpp, src/llama-model.cpp, ggml-cpu rope)",
    "ggml-cpu/ops.cpp @ 0049e3c (multi-section rope)",
  ],
  artifactKind: "launch-args",
  compile,
  read: (config: Record<string, unknown>, artifact: TargetArtifact) => readLlamaCpp(config, artifact),
};
