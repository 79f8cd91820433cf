/**
 * The transformers v5 layout for a layered model: `rope_parameters` nested by layer type, one block per kind that
 * rotates. huggingface/transformers, RotaryEmbeddingConfigMixin.standardize_rope_params (configuration_utils.py,
 * v5 line, read through a stored copy): when the dict's keys are a subset of `layer_types`, each entry is that
 * layer type's own rope setting ("Case 2: different RoPE for each layer"), and each entry keeps its own rope_theta.
 * Layers without rotary positions (no_rope) are not a layer type there and get no entry.
 */
export interface GroupBlock {
  kind: string;
  ropeTheta: number | null;
  /** the group's scaling block (rope_scaling keys with rope_type), or null when it runs unscaled */
  block: Record<string, unknown> | null;
}

export function nestRopeParameters(groups: readonly GroupBlock[]): Record<string, Record<string, unknown>> {
  const out: Record<string, Record<string, unknown>> = {};
  for (const g of groups) {
    if (g.ropeTheta === null) continue;
    const { type: legacyType, rope_type: ropeType, ...rest } = g.block ?? {};
    out[g.kind] = { rope_type: ropeType ?? legacyType ?? "default", ...rest, rope_theta: g.ropeTheta };
  }
  return out;
}
