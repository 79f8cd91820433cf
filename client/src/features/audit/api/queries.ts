import { auditChainQuery } from "./verify-chain";
import { auditPageQuery } from "./list-audit";

/** The audit feature's query factory. */
export const auditQueries = {
  page: auditPageQuery,
  chain: auditChainQuery,
};
