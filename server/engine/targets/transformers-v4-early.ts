import type { ExportTarget } from "./types";
import { loadConfig } from "./hf/config-view";
import { compileV4 } from "./hf/compile";
import { readV4 } from "./hf/read-v4";

/**
 * huggingface/transformers, the 4.4x line (rules read in src/transformers/modeling_rope_utils.py at commits 0044e3b
 * and ef46806, the latter on the 4.45 line; later 4.4x releases are expected to match, not checked): yarn's ramp
 * length is max_position_embeddings, so the patch keeps the trained length there and writes the attention factor
 * explicitly. The rotary dim follows head_dim when the config has one (docs/export-targets.md).
 */
export const transformersV4EarlyTarget: ExportTarget = {
  id: "transformers-v4-early",
  label: "Transformers 4.4x (config.json)",
  consumer: "huggingface/transformers",
  versions: ["4.45"],
  artifactKind: "config-merge-patch",
  compile: (input) => compileV4(input, "early"),
  read: (config, artifact, runningLength) => readV4(loadConfig(config, artifact), "early", runningLength),
};
