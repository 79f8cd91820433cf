import type { TokenScope } from "../../shared/schemas";

/** One thing a scope lets a token do: these methods on API paths (relative to /api) matching `path`. */
interface Grant {
  methods: readonly string[];
  path: RegExp;
}

const READ = ["GET", "HEAD"] as const;

/**
 * Deny by default: a bearer request passes only when one of its token's scopes grants the method and path.
 * Nothing here reaches users, audit, mail, tokens or the session, whatever roles the token's owner holds.
 * A new scope adds its member to TOKEN_SCOPES (shared/schemas/tokens.ts) and its grants here; the compiler
 * insists on both.
 */
const GRANTS: Record<TokenScope, readonly Grant[]> = {
  "export:read": [{ methods: READ, path: /^\/plans(?:\/|$)/ }],
  // Probe results only: one POST route, and the plan's check list to read back what was recorded.
  "conformance:write": [
    { methods: ["POST"], path: /^\/plans\/\d+\/revisions\/\d+\/conformance-checks$/ },
    { methods: READ, path: /^\/plans\/\d+\/conformance-checks$/ },
  ],
  // Evaluation results from a training job: the upload, and the revision's evidence list to read the verdicts back.
  "evidence:write": [{ methods: ["POST", ...READ], path: /^\/plans\/\d+\/revisions\/\d+\/evidence$/ }],
};

export const scopesAllow = (scopes: readonly TokenScope[], method: string, path: string) =>
  scopes.some((s) => GRANTS[s]?.some((g) => g.methods.includes(method) && g.path.test(path)));

/** True when none of the scopes grants any write method, i.e. a read-only token. */
export const onlyReads = (scopes: readonly TokenScope[]) =>
  scopes.every((s) => GRANTS[s]?.every((g) => g.methods.every((m) => (READ as readonly string[]).includes(m))));
