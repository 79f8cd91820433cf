/** Query keys for the signed-in user's API tokens. */
export const tokensKeys = {
  all: ["tokens"] as const,
  list: () => [...tokensKeys.all, "list"] as const,
};
