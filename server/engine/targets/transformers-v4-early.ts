import { pendingTarget } from "./stub";

export const transformersV4EarlyTarget = pendingTarget(
  "transformers-v4-early",
  "transformers-v4-early",
  "huggingface/transformers",
  "config-merge-patch",
);
