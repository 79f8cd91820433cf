import { pendingTarget } from "./stub";

export const transformersV5Target = pendingTarget(
  "transformers-v5",
  "transformers-v5",
  "huggingface/transformers",
  "config-merge-patch",
);
