import type { MethodId, MethodParams } from "../../../shared/schemas/analysis";
import { METHOD_CATALOG } from "../../../shared/methods";
import { planRotary } from "../../../server/engine/targets";
import type { CompileInput, ExportTarget, PlanRun } from "../../../server/engine/targets/types";

/** A Llama-2-7B-like config.json (d = 128, b = 10 000, L = 4096); fictional values in the open config format. */
export const LLAMA2_LIKE: Record<string, unknown> = {
  model_type: "llama",
  architectures: ["LlamaForCausalLM"],
  hidden_size: 4096,
  num_attention_heads: 32,
  num_key_value_heads: 32,
  max_position_embeddings: 4096,
  rope_theta: 10000.0,
  rope_scaling: null,
};

/** The published Llama 3.1 shape: b = 500 000, trained 8192, llama3 block f = 8, low 1, high 4. */
export const LLAMA31_LIKE: Record<string, unknown> = {
  model_type: "llama",
  hidden_size: 4096,
  num_attention_heads: 32,
  max_position_embeddings: 131072,
  rope_theta: 500000.0,
  rope_scaling: {
    rope_type: "llama3",
    factor: 8.0,
    low_freq_factor: 1.0,
    high_freq_factor: 4.0,
    original_max_position_embeddings: 8192,
  },
};

/** The plan as the engine computes it for a method on a model of rotary dim d, base b, trained length L. */
export function planFor(
  method: MethodParams,
  shape: { d: number; base: number; trained: number },
  targetContext: number,
): PlanRun {
  return planRotary({ d: shape.d, base: shape.base, trainedContext: shape.trained, targetContext }, method);
}

export const LLAMA2_SHAPE = { d: 128, base: 10_000, trained: 4096 };

export function inputFor(
  method: MethodParams,
  targetContext: number,
  config = LLAMA2_LIKE,
  shape = LLAMA2_SHAPE,
): CompileInput {
  return { config, method, plan: planFor(method, shape, targetContext) };
}

/** The catalog's example parameters for a method (longrope gets one factor per pair). */
export const exampleOf = (id: MethodId, d = 128): MethodParams => METHOD_CATALOG[id].example(d / 2) as MethodParams;

/** Largest relative difference over θ′ and the attention factor. */
export function maxRelError(
  a: { invFreq: number[]; attentionFactor: number },
  b: { invFreq: number[]; attentionFactor: number },
) {
  const rel = (x: number, y: number) => (x === y ? 0 : Math.abs(x - y) / Math.abs(y));
  return Math.max(rel(a.attentionFactor, b.attentionFactor), ...a.invFreq.map((x, i) => rel(x, b.invFreq[i])));
}

/** Compile and read back through the target's own reader at the target length. */
export function roundTrip(target: ExportTarget, input: CompileInput) {
  const compiled = target.compile(input);
  const reading = compiled.artifact ? target.read(input.config, compiled.artifact, input.plan.targetContext) : null;
  return { compiled, reading };
}

/** Splits the downloadable text back into arguments (POSIX single quotes and line continuations only). */
export function shellWords(text: string): string[] {
  const words: string[] = [];
  const re = /'((?:[^']|'\\'')*)'|([^\s'\\]+)|\\\n/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(text))) {
    if (m[1] !== undefined) words.push(m[1].replaceAll(`'\\''`, "'"));
    else if (m[2] !== undefined) words.push(m[2]);
  }
  return words;
}

/** Parameter sets beyond the catalog examples: explicit attention factors, the mscale pair, untruncated ramps. */
export const VARIANTS: { params: MethodParams; target: number }[] = [
  { params: { method: "yarn", attentionFactor: 1.1 }, target: 32_768 },
  { params: { method: "yarn", mscale: 1, mscaleAllDim: 0.5 }, target: 65_536 },
  { params: { method: "yarn", truncate: false, betaFast: 16, betaSlow: 2 }, target: 16_384 },
  { params: { method: "llama3", factor: 8, lowFreqFactor: 2, highFreqFactor: 8 }, target: 32_768 },
  { params: { method: "linear", factor: 3 }, target: 12_288 },
  { params: { method: "ntk", factor: 3 }, target: 12_288 },
  { params: exampleOf("longrope"), target: 4096 },
];
