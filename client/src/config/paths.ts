import { env } from "./env";

/** Route patterns, as the router sees them. Build links with `paths`, never with string literals elsewhere. */
export const routes = {
  home: "/",
  signIn: "/sign-in",
  users: "/users",
  profile: "/profile",
  estimator: "/estimator",
  accelerators: "/accelerators",
  plans: "/plans",
  planNew: "/plans/new",
  plan: "/plans/:id",
  planEdit: "/plans/:id/revisions/:n/edit",
  planDiff: "/plans/:id/diff",
  review: "/review",
  audit: "/audit",
  mail: "/mail",
  models: "/models",
  modelNew: "/models/new",
  modelImport: "/models/import",
  model: "/models/:id",
  workbench: "/workbench",
} as const;

/**
 * Only same-site paths may be used as a "back to" target after sign-in; anything else
 * (absolute URLs, protocol-relative "//host", backslash tricks) falls back to home.
 */
export function safeNext(raw: string | null | undefined): string {
  if (!raw || !raw.startsWith("/") || raw.startsWith("//") || raw.startsWith("/\\")) return routes.home;
  if (raw.startsWith(routes.signIn)) return routes.home;
  return raw;
}

export const paths = {
  home: () => routes.home,
  signIn: (next?: string) =>
    next && safeNext(next) !== routes.home ? `${routes.signIn}?next=${encodeURIComponent(next)}` : routes.signIn,
  users: () => routes.users,
  profile: () => routes.profile,
  estimator: (search = "") => `${routes.estimator}${search}`,
  accelerators: () => routes.accelerators,
  plans: (search = "") => `${routes.plans}${search}`,
  planNew: () => routes.planNew,
  plan: (id: number, revision?: number) => `/plans/${id}${revision ? `?revision=${revision}` : ""}`,
  planEdit: (id: number, n: number) => `/plans/${id}/revisions/${n}/edit`,
  planDiff: (id: number, a: number, b: number) => `/plans/${id}/diff?a=${a}&b=${b}`,
  review: () => routes.review,
  audit: () => routes.audit,
  mail: () => routes.mail,
  models: () => routes.models,
  modelNew: () => routes.modelNew,
  modelImport: () => routes.modelImport,
  model: (id: number) => `/models/${id}`,
  /** `search` is the workbench's own encoded state ("?model=3&target=…"), built by the workbench feature. */
  workbench: (search = "") => `${routes.workbench}${search}`,
};

const api = (path: string) => `${env.apiBase}/api${path}`;

type QueryValues = Record<string, string | number | boolean | null | undefined>;
/** `?a=1&b=x` from the set values only (empty string, null and undefined are left out). */
function withQuery(path: string, query: QueryValues = {}) {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(query)) if (v !== undefined && v !== null && v !== "") params.set(k, String(v));
  const qs = params.toString();
  return api(qs ? `${path}?${qs}` : path);
}
const rev = (id: number, n: number) => `/plans/${id}/revisions/${n}`;

export const apiPaths = {
  session: () => api("/auth/session"),
  login: () => api("/auth/login"),
  logout: () => api("/auth/logout"),
  password: () => api("/auth/password"),
  users: (query?: QueryValues) => withQuery("/users", query),
  user: (id: number) => api(`/users/${encodeURIComponent(String(id))}`),
  // budget sheet, estimator and accelerator catalog
  budgetEstimate: () => api("/budgets/estimate"),
  budgetRecipes: () => api("/budgets/recipes"),
  budgetCurrency: () => api("/budgets/currency"),
  accelerators: () => api("/accelerators"),
  accelerator: (id: number) => api(`/accelerators/${encodeURIComponent(String(id))}`),
  acceleratorRestore: (id: number) => api(`/accelerators/${encodeURIComponent(String(id))}/restore`),
  // plans workflow, review, tokens, audit and mail
  plans: (query?: QueryValues) => withQuery("/plans", query),
  plan: (id: number) => api(`/plans/${id}`),
  planSettings: () => api("/plans/settings"),
  planOwners: () => api("/plans/owners"),
  reviewQueue: (query?: QueryValues) => withQuery("/plans/review-queue", query),
  planRevisions: (id: number) => api(`/plans/${id}/revisions`),
  revision: (id: number, n: number) => api(rev(id, n)),
  revisionSubmit: (id: number, n: number) => api(`${rev(id, n)}/submit`),
  revisionWithdraw: (id: number, n: number) => api(`${rev(id, n)}/withdraw`),
  revisionDecisions: (id: number, n: number) => api(`${rev(id, n)}/decisions`),
  revisionVerify: (id: number, n: number) => api(`${rev(id, n)}/verify`),
  revisionDiff: (id: number, a: number, b: number) => api(`${rev(id, a)}/diff/${b}`),
  revisionReport: (id: number, n: number, download = false) =>
    withQuery(`${rev(id, n)}/report`, { download: download ? 1 : undefined }),
  revisionExport: (id: number, n: number, download = false) =>
    withQuery(`${rev(id, n)}/export`, { download: download ? 1 : undefined }),
  approvedExport: (id: number, download = false, target?: string) =>
    withQuery(`/plans/${id}/approved/export`, { download: download ? 1 : undefined, target }),
  exportTargets: () => api("/export-targets"),
  exports: () => api("/exports"),
  conformanceChecks: (id: number) => api(`/plans/${id}/conformance-checks`),
  revisionConformanceChecks: (id: number, n: number) => api(`${rev(id, n)}/conformance-checks`),
  // evaluation evidence and proof of an approved revision
  revisionEvidence: (id: number, n: number) => api(`${rev(id, n)}/evidence`),
  evidenceFile: (id: number, n: number, evidenceId: number) => api(`${rev(id, n)}/evidence/${evidenceId}/file`),
  revisionProof: (id: number, n: number) => api(`${rev(id, n)}/proof`),
  tokens: () => api("/tokens"),
  token: (id: number) => api(`/tokens/${id}`),
  audit: (query?: QueryValues) => withQuery("/audit", query),
  auditVerify: () => api("/audit/verify"),
  mail: (query?: QueryValues) => withQuery("/mail", query),
  mailDeliver: () => api("/mail/deliver"),
  // model profiles, analyses and base bounds
  models: (query?: QueryValues) => withQuery("/models", query),
  model: (id: number) => api(`/models/${id}`),
  modelRestore: (id: number) => api(`/models/${id}/restore`),
  modelSource: (id: number) => api(`/models/${id}/source`),
  modelImport: (save: boolean) => withQuery("/models/import", { save: save ? "true" : undefined }),
  analyses: () => api("/analyses"),
  baseBound: () => api("/bounds/base"),
  baseBoundStream: () => api("/bounds/base/stream"),
};
