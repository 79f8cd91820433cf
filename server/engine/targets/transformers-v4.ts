import { pendingTarget } from "./stub";

export const transformersV4Target = pendingTarget(
  "transformers-v4",
  "transformers-v4",
  "huggingface/transformers",
  "config-merge-patch",
);
