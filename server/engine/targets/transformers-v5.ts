import type { ExportTarget } from "./types";
import { loadConfig } from "./hf/config-view";
import { compileV5 } from "./hf/compile";
import { readV5 } from "./hf/read-v5";

/**
 * huggingface/transformers 5.x: the `rope_parameters` layout with rope_theta inside, nested by layer type when the
 * config declares layer types (RotaryEmbeddingConfigMixin in src/transformers/modeling_rope_utils.py).
 */
export const transformersV5Target: ExportTarget = {
  id: "transformers-v5",
  label: "Transformers 5 (config.json, rope_parameters)",
  consumer: "huggingface/transformers",
  versions: ["5.0", "5.x"],
  artifactKind: "config-merge-patch",
  compile: compileV5,
  read: (config, artifact, runningLength) => readV5(loadConfig(config, artifact), runningLength),
};
