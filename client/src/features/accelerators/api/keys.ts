/** Query keys for the accelerator catalog. */
export const acceleratorsKeys = {
  all: ["accelerators"] as const,
  list: () => [...acceleratorsKeys.all, "list"] as const,
};
