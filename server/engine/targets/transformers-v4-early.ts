import type { ExportTarget } from "./types";
import { loadConfig } from "./hf/config-view";
import { compileV4 } from "./hf/compile";
import { readV4 } from "./hf/read-v4";

/**
 * huggingface/transformers, the 4.4x line (rules read in src/transformers/modeling_rope_utils.py at commit 0044e3b,
 * the v4.45 line; neighbouring 4.4x releases are expected to match, not checked): yarn's ramp length is max_position_embeddings, so the
 * patch keeps the trained length there and writes the attention factor explicitly.
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
