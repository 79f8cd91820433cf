import { auditPageQuery } from "./list-audit";

/** The audit feature's query factory. */
export const auditQueries = {
  page: auditPageQuery,
};
