import type { ExportTarget } from "./types";
import { loadConfig } from "./hf/config-view";
import { compileV4 } from "./hf/compile";
import { readV4 } from "./hf/read-v4";

/**
 * huggingface/transformers from 4.55 to the end of the 4.x line: yarn reads original_max_position_embeddings from the
 * block (and derives the factor from it), mscale/mscale_all_dim and truncate (src/transformers/modeling_rope_utils.py;
 * the releases are in docs/export-targets.md).
 */
export const transformersV4Target: ExportTarget = {
  id: "transformers-v4",
  label: "Transformers 4.55–4.57 (config.json)",
  consumer: "huggingface/transformers",
  versions: ["4.55", "4.56", "4.57"],
  artifactKind: "config-merge-patch",
  compile: (input) => compileV4(input, "v4"),
  read: (config, artifact, runningLength) => readV4(loadConfig(config, artifact), "v4", runningLength),
};
