/** Query keys for the admin mail views. */
export const mailKeys = {
  all: ["mail"] as const,
  view: (q: string) => [...mailKeys.all, "view", q] as const,
};
