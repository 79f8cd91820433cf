import type { AuditParams } from "./list-audit";

/** Query keys for the audit trail. */
export const auditKeys = {
  all: ["audit"] as const,
  page: (params: AuditParams) => [...auditKeys.all, "page", params] as const,
  chain: () => [...auditKeys.all, "chain"] as const,
};
