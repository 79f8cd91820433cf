// The list endpoints bench:scale times and explains: each URL and which demo account asks it. Search words are chosen
// against seed.sql's rows (a purpose "… towline line, batch 991", profiles "Halyard-11-…", people "… Ropemaker44").
export type Asker = "admin" | "approver";
export interface ListCase {
  label: string;
  url: string;
  as: Asker;
}

/**
 * Orders whose deep pages are read by keyset cursor, both ways: each `after` is 40 000 plans in under that order (page
 * 2 001 of 20 a page) and each `before` that page's `prevBefore` (page 2 000), found once before the cases run
 * (planCursors in run.ts).
 */
export const DEEP_PLAN_ORDERS = [
  "sort=updatedAt&dir=desc",
  "sort=createdAt&dir=asc",
  "sort=title&dir=asc",
  "sort=state&dir=asc",
  "sort=owner&dir=asc",
  "sort=model&dir=desc",
];

export const listCases = (
  midAuditId: string,
  planCursors: Record<string, { after: string; before: string }> = {},
): ListCase[] => [
  { label: "/api/plans", url: "/api/plans", as: "admin" },
  { label: "/api/plans?state=in_review", url: "/api/plans?state=in_review", as: "admin" },
  { label: "/api/plans?q=…", url: "/api/plans?q=towline%20line%2C%20batch%20991", as: "admin" },
  { label: "/api/plans?q= (no match)", url: "/api/plans?q=no-such-words-here", as: "admin" },
  { label: "/api/plans?sort=owner", url: "/api/plans?sort=owner&dir=asc", as: "admin" },
  { label: "/api/plans?sort=model", url: "/api/plans?sort=model", as: "admin" },
  { label: "/api/plans?sort=title", url: "/api/plans?sort=title&dir=asc", as: "admin" },
  { label: "/api/plans?ownerId=…", url: "/api/plans?ownerId=7", as: "admin" },
  { label: "/api/plans?modelId=…", url: "/api/plans?modelId=11", as: "admin" },
  { label: "/api/plans?proof=none", url: "/api/plans?proof=none", as: "admin" },
  { label: "/api/plans?proof=proven", url: "/api/plans?proof=proven", as: "admin" },
  { label: "/api/plans?proof=none&state=approved", url: "/api/plans?proof=none&state=approved", as: "admin" },
  { label: "/api/plans?proof=none&state=draft", url: "/api/plans?proof=none&state=draft", as: "admin" },
  { label: "/api/plans?proof=none&state=in_review", url: "/api/plans?proof=none&state=in_review", as: "admin" },
  { label: "/api/plans?proof=none&ownerId=…", url: "/api/plans?proof=none&ownerId=7", as: "admin" },
  { label: "/api/plans?proof=none&modelId=…", url: "/api/plans?proof=none&modelId=11", as: "admin" },
  { label: "/api/plans?proof=none&q=…", url: "/api/plans?proof=none&q=towline%20line%2C%20batch%20991", as: "admin" },
  // The deepest page the server answers by number (an OFFSET): the capped total's last, 10 000 plans in.
  { label: "/api/plans page 500 (deepest by number)", url: "/api/plans?page=500", as: "admin" },
  ...DEEP_PLAN_ORDERS.filter((o) => planCursors[o]).flatMap((o) => [
    {
      label: `/api/plans?${o} deep (keyset)`,
      url: `/api/plans?${o}&page=2001&after=${planCursors[o]!.after}`,
      as: "admin" as const,
    },
    {
      label: `/api/plans?${o} deep previous (keyset)`,
      url: `/api/plans?${o}&page=2000&before=${planCursors[o]!.before}`,
      as: "admin" as const,
    },
  ]),
  { label: "/api/audit", url: "/api/audit", as: "admin" },
  { label: "/api/audit deep (keyset)", url: `/api/audit?before=${midAuditId}`, as: "admin" },
  { label: "/api/audit deep (page 200)", url: "/api/audit?page=200", as: "admin" },
  { label: "/api/audit?actorId=…", url: "/api/audit?actorId=7", as: "admin" },
  { label: "/api/audit?action=…", url: "/api/audit?action=decision.", as: "admin" },
  { label: "/api/audit?action= (rare)", url: "/api/audit?action=user.role", as: "admin" },
  { label: "/api/audit?subject=…", url: "/api/audit?subjectType=plan&subjectId=4242", as: "admin" },
  { label: "/api/mail", url: "/api/mail", as: "admin" },
  { label: "/api/mail?q= (no match)", url: "/api/mail?q=no-such-words-here", as: "admin" },
  { label: "/api/plans/review-queue", url: "/api/plans/review-queue", as: "approver" },
  { label: "/api/plans/owners", url: "/api/plans/owners", as: "admin" },
  { label: "/api/models", url: "/api/models", as: "admin" },
  { label: "/api/models page 20", url: "/api/models?page=20", as: "admin" },
  { label: "/api/models?q=… (picker search)", url: "/api/models?q=Halyard-11&retired=exclude", as: "admin" },
  { label: "/api/users", url: "/api/users", as: "admin" },
  { label: "/api/users page 5", url: "/api/users?page=5", as: "admin" },
  { label: "/api/users?q=…", url: "/api/users?q=Ropemaker44", as: "admin" },
];
