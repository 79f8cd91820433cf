import { isObj, numberOr } from "../../../../shared/json-values";

/**
 * How vLLM turns a config (after `--hf-overrides`) into the rope parameters get_rope sees, and the longest
 * max_model_len it accepts. Both rules restate vllm-project/vllm source; see docs/export-targets-engines.md.
 */

/**
 * `patch_rope_parameters` (vllm/transformers_utils/config.py, rope_parameters era; our stored copy names no commit) with transformers v4 installed: a non-null
 * rope_scaling replaces rope_parameters; then the top-level rope_theta, partial_rotary_factor and
 * original_max_position_embeddings are copied into the block; `patch_rope_parameters_dict` turns a legacy `type` into
 * `rope_type` and "su" into "longrope". With transformers v5 installed the block is rope_parameters as given; a config
 * where the two installs would read different blocks gets a warning.
 */
export function vllmRopeParameters(config: Record<string, unknown>): {
  rp: Record<string, unknown>;
  warnings: string[];
} {
  const warnings: string[] = [];
  const scaling = isObj(config.rope_scaling) ? config.rope_scaling : null;
  const params = isObj(config.rope_parameters) ? config.rope_parameters : null;
  const v4: Record<string, unknown> = { ...(scaling ?? params ?? { rope_type: "default" }) };
  for (const key of ["rope_theta", "partial_rotary_factor", "original_max_position_embeddings"]) {
    if (config[key] !== undefined && config[key] !== null) v4[key] = config[key];
  }
  if (!("rope_type" in v4) && typeof v4.type === "string") v4.rope_type = v4.type;
  if (typeof v4.type === "string" && v4.type !== v4.rope_type && !(v4.type === "su" && v4.rope_type === "longrope")) {
    throw new Error(`rope_type=${String(v4.rope_type)} conflicts with type=${v4.type}: vLLM refuses the config`);
  }
  if (v4.rope_type === "su") v4.rope_type = "longrope";
  // v5's standardize_rope_params fills rope_theta and partial_rotary_factor from the top level when the block lacks them.
  const v5 = params && { ...params };
  for (const key of ["rope_theta", "partial_rotary_factor"]) {
    if (v5 && v5[key] === undefined && config[key] !== undefined && config[key] !== null) v5[key] = config[key];
  }
  if (v5 && scaling && JSON.stringify(stripped(v5)) !== JSON.stringify(stripped(v4))) {
    warnings.push(
      "rope_parameters and rope_scaling disagree: transformers v4 and v5 installs of vLLM would run different blocks",
    );
  }
  return { rp: v4, warnings };
}

const stripped = (b: Record<string, unknown>) =>
  Object.fromEntries(
    Object.entries(b)
      .filter(([k]) => k !== "type")
      .sort(([a], [c]) => a.localeCompare(c)),
  );

/** The length keys `_get_and_verify_max_len` looks at, smallest wins (vllm/config/model.py, 0052a5b). */
const LENGTH_KEYS = [
  "max_position_embeddings",
  "n_positions",
  "max_seq_len",
  "seq_length",
  "model_max_length",
  "max_target_positions",
  "max_sequence_length",
  "max_seq_length",
  "seq_len",
];

/**
 * The derived max_model_len (vllm/config/model.py `_get_and_verify_max_len`, 0052a5b): the smallest length key
 * (model_max_length wins outright), 2048 when there is none; for rope types other than su, longrope and llama3 it is
 * multiplied by `factor`, and for yarn it starts from original_max_position_embeddings instead.
 */
export function derivedMaxModelLen(config: Record<string, unknown>, rp: Record<string, unknown>): number {
  let derived = Infinity;
  for (const key of LENGTH_KEYS) {
    const v = config[key];
    if (typeof v === "number") derived = Math.min(derived, v);
  }
  if (typeof config.model_max_length === "number" && config.model_max_length) derived = config.model_max_length;
  if (derived === Infinity) derived = 2048;
  const type = String(rp.rope_type ?? "default");
  if (!["su", "longrope", "llama3"].includes(type)) {
    const factor = numberOr(rp.factor, 1);
    if (type === "yarn") derived = numberOr(rp.original_max_position_embeddings, derived);
    derived *= factor;
  }
  return derived;
}
