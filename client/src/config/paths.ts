import { env } from "./env";

/** Route patterns, as the router sees them. Build links with `paths`, never with string literals elsewhere. */
export const routes = {
  home: "/",
  signIn: "/sign-in",
  users: "/users",
  profile: "/profile",
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
    next && safeNext(next) !== routes.home
      ? `${routes.signIn}?next=${encodeURIComponent(next)}`
      : routes.signIn,
  users: () => routes.users,
  profile: () => routes.profile,
};

const api = (path: string) => `${env.apiBase}/api${path}`;

export const apiPaths = {
  session: () => api("/auth/session"),
  login: () => api("/auth/login"),
  logout: () => api("/auth/logout"),
  password: () => api("/auth/password"),
  users: () => api("/users"),
  user: (id: number) => api(`/users/${encodeURIComponent(String(id))}`),
};
