/** Query keys for model profiles, general to specific. */
export const modelsKeys = {
  all: ["models"] as const,
  list: () => [...modelsKeys.all, "list"] as const,
  detail: (id: number) => [...modelsKeys.all, "detail", id] as const,
};
