/**
 * How a token is used: a curl line for the approved export (GET /api/plans/:id/approved/export, the route a bearer
 * token may call with export:read). The token stays a placeholder: its secret is shown once, at creation.
 */
export function exportCurlExample(origin: string): string {
  return [
    `export ROPEWALK_TOKEN='rw_…'   # the secret shown once when you create the token`,
    `curl -fsS -H "Authorization: Bearer $ROPEWALK_TOKEN" \\`,
    `  "${origin}/api/plans/42/approved/export?target=vllm" > export-vllm.json`,
  ].join("\n");
}
