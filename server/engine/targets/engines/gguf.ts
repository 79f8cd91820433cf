import { headSize } from "./plan-facts";
import { isObj, numberOr } from "../../../../shared/json-values";
import { blockSections } from "../../../../shared/mrope-axes";

/**
 * GGUF side of the llama.cpp target: the architecture prefix of the metadata keys, the rope metadata the converter
 * writes for a config.json, and `--override-kv` parsing. Key names are those of ggml-org/llama.cpp src/llama-arch.cpp
 * (LLM_KV_NAMES); docs/export-targets-engines.md.
 */
export type Metadata = Record<string, number | string | boolean | number[]>;

/**
 * convert_hf_to_gguf.py registers each Hugging Face architecture under a GGUF architecture name; the common decoders
 * map as below (from memory of the converter's model classes: MistralForCausalLM is converted by the Llama class).
 * Anything else keeps its model_type, which is the converter's name for most families.
 */
const ARCH_BY_MODEL_TYPE: Record<string, string> = {
  llama: "llama",
  mistral: "llama",
  qwen2: "qwen2",
  qwen3: "qwen3",
  // the multimodal families (src/llama-arch.cpp names LLM_ARCH_QWEN2VL, QWEN3VL, QWEN3VLMOE; the strings from memory)
  qwen2_vl: "qwen2vl",
  qwen3_vl: "qwen3vl",
  qwen3_vl_moe: "qwen3vlmoe",
};

/**
 * How llama.cpp lays out multimodal sections, fixed by architecture, not by any key: `llama_model_rope_type` in
 * ggml-org/llama.cpp src/llama-model.cpp (read through stored copies that name no commit) gives QWEN2VL the rope type
 * MROPE (contiguous blocks t, h, w) and QWEN3VL / QWEN3VLMOE the type IMROPE (interleaved T H W T H W …); every other
 * architecture here rotates on one position axis and never reads the sections. The layouts match the followed loaders'
 * (ggml/src/ggml-cpu/ops.cpp at 0049e3c, ggml_mrope_cache_init: contiguous sectors, or sector % 3 == 1 below
 * 3·sections[1] for height and % 3 == 2 below 3·sections[2] for width; shared/mrope-axes.ts).
 */
export const SECTIONED_ARCHS: Readonly<Record<string, "contiguous" | "interleaved">> = {
  qwen2vl: "contiguous",
  qwen3vl: "interleaved",
  qwen3vlmoe: "interleaved",
};

/** The model's multimodal sections (in its scaling block, either spelling), or null. */
export function configSections(config: Record<string, unknown>): { section: number[]; interleaved: boolean } | null {
  return blockSections(config.rope_parameters) ?? blockSections(config.rope_scaling);
}

/**
 * The sections as the converter writes them: `mrope_section` padded with zeros to four entries (t, h, w, extra) under
 * `<arch>.rope.dimension_sections` (convert_hf_to_gguf.py, TextModel.set_gguf_parameters: "Pad to 4 dimensions",
 * gguf_writer.add_rope_dimension_sections; read through stored copies at a458664 and later).
 */
export const ggufSections = (section: readonly number[]) => [...section, 0, 0, 0, 0].slice(0, 4);

export function ggufArch(config: Record<string, unknown>): string {
  const type = typeof config.model_type === "string" ? config.model_type : "llama";
  return ARCH_BY_MODEL_TYPE[type] ?? type;
}

export const key = (arch: string, name: string) => `${arch}.${name}`;

/** The plain-RoPE metadata a conversion of this config.json carries (context length, base, rotated dimensions). */
export function convertedMetadata(config: Record<string, unknown>): Metadata {
  const arch = ggufArch(config);
  const meta: Metadata = { "general.architecture": arch };
  if (typeof config.max_position_embeddings === "number")
    meta[key(arch, "context_length")] = config.max_position_embeddings;
  if (typeof config.rope_theta === "number") meta[key(arch, "rope.freq_base")] = config.rope_theta;
  meta[key(arch, "rope.dimension_count")] = Math.floor(headSize(config) * numberOr(config.partial_rotary_factor, 1));
  const sections = configSections(config);
  if (sections) meta[key(arch, "rope.dimension_sections")] = ggufSections(sections.section);
  const rs = isObj(config.rope_scaling) ? config.rope_scaling : null;
  const type = rs && (rs.rope_type ?? rs.type);
  // The converter writes linear and yarn blocks as metadata (convert_hf_to_gguf.py, TextModel.set_gguf_parameters).
  if (rs && (type === "linear" || type === "yarn") && typeof rs.factor === "number") {
    meta[key(arch, "rope.scaling.type")] = type;
    meta[key(arch, "rope.scaling.factor")] = rs.factor;
    if (type === "yarn" && typeof rs.original_max_position_embeddings === "number") {
      meta[key(arch, "rope.scaling.original_context_length")] = rs.original_max_position_embeddings;
    }
  }
  return meta;
}

/**
 * Per-pair divisors the converter stores as a tensor instead of metadata: llama3 blocks become `rope_freqs`
 * (LlamaModel.generate_extra_tensors: 1 for short wavelengths, the factor for long ones, a smooth blend between, the
 * rule published with the Llama 3.1 models). ggml divides θ_i by them (ggml_rope_cache_init: theta/ff). LongRoPE's
 * rope_factors_long/short tensors are not followed here.
 */
export function convertedFreqFactors(config: Record<string, unknown>, d: number, base: number): number[] | null {
  const rs = isObj(config.rope_scaling) ? config.rope_scaling : null;
  const type = rs && (rs.rope_type ?? rs.type);
  if (!rs || type === undefined || type === null) return null;
  if (type === "longrope" || type === "su")
    throw new Error("LongRoPE GGUFs carry factor tensors this reader does not follow");
  if (type !== "llama3") return null;
  const factor = numberOr(rs.factor, 8);
  const low = numberOr(rs.low_freq_factor, 1);
  const high = numberOr(rs.high_freq_factor, 4);
  // The converter takes the original length from the config's top level, not from the block (default 8192).
  const original = numberOr(config.original_max_position_embeddings, 8192);
  return Array.from({ length: d / 2 }, (_, i) => {
    const wave = 2 * Math.PI * Math.pow(base, (2 * i) / d);
    if (wave < original / high) return 1;
    if (wave > original / low) return factor;
    const smooth = (original / wave - low) / (high - low);
    return 1 / ((1 - smooth) / factor + smooth);
  });
}

/** `--override-kv KEY=TYPE:VALUE`, types int, float, bool, str (common/arg.cpp, string_parse_kv_override). */
export function parseKvOverride(text: string): [string, number | string | boolean] {
  const m = /^([^=]+)=(int|float|bool|str):(.*)$/.exec(text);
  if (!m) throw new Error(`--override-kv ${text}: llama.cpp refuses it (KEY=TYPE:VALUE)`);
  const [, k, type, value] = m;
  if (type === "str") return [k, value];
  if (type === "bool") {
    if (value !== "true" && value !== "false") throw new Error(`--override-kv ${text}: bool must be true or false`);
    return [k, value === "true"];
  }
  const n = Number(value);
  if (!Number.isFinite(n) || (type === "int" && !Number.isInteger(n)))
    throw new Error(`--override-kv ${text}: not a ${type}`);
  return [k, n];
}
