import type { MethodParams } from "../../../../shared/schemas/analysis";
import { runMethod } from "../../../../server/engine";
import { planRotary, type CompileInput } from "../../../../server/engine/targets";

/** A Llama-like config.json (4.x layout): d = 4096 / 32 = 128, b = 500 000, trained on 8192 tokens. */
export const LLAMA_LIKE = {
  model_type: "llama",
  hidden_size: 4096,
  num_attention_heads: 32,
  num_key_value_heads: 8,
  num_hidden_layers: 32,
  rope_theta: 500000.0,
  max_position_embeddings: 8192,
  rope_scaling: null,
};

/** The engine's plan for a config shape, as the export service builds it (one run of the method, planRotary). */
export function planInput(
  config: Record<string, unknown>,
  method: MethodParams,
  shape: { d: number; base: number; trained: number; target: number },
): CompileInput {
  const ctx = { d: shape.d, base: shape.base, trainedContext: shape.trained, targetContext: shape.target };
  return { config, method, plan: planRotary(ctx, method) };
}

/** The config patch Ropewalk exported before export targets existed: the method's patch as JSON.stringify wrote it. */
export function legacyArtifact(input: CompileInput) {
  const { plan, method } = input;
  const ctx = {
    d: plan.rotaryDim,
    base: plan.base,
    trainedContext: plan.trainedContext,
    targetContext: plan.targetContext,
  };
  const content = runMethod(ctx, method).ropeScaling as Record<string, unknown>;
  return { kind: "config-merge-patch" as const, content, text: JSON.stringify(content, null, 2) };
}
