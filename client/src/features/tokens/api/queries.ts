import { listTokensQuery } from "./list-tokens";

/** The tokens feature's query factory. */
export const tokensQueries = {
  list: listTokensQuery,
};
