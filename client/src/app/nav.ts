import type { Role } from "@shared/schemas/common";
import { routes } from "../config/paths";

/** Who may see an entry: everyone signed in, or holders of at least one listed role. */
export type Audience = "everyone" | readonly Role[];

export type NavEntry = { id: string; label: string; to: string; audience: Audience };

/**
 * The one list of top-level screens. The navigation strand and the route gates both read it,
 * so adding a screen is one line here plus its route. Keep Profile last.
 */
export const NAV = [
  { id: "home", label: "Home", to: routes.home, audience: "everyone" },
  { id: "users", label: "Users", to: routes.users, audience: ["admin"] },
  { id: "models", label: "Profiles", to: routes.models, audience: "everyone" },
  { id: "workbench", label: "Workbench", to: routes.workbench, audience: "everyone" },
  { id: "plans", label: "Plans", to: routes.plans, audience: "everyone" },
  { id: "estimator", label: "Estimator", to: routes.estimator, audience: "everyone" },
  { id: "accelerators", label: "Accelerators", to: routes.accelerators, audience: "everyone" },
  { id: "review", label: "Inspection", to: routes.review, audience: ["approver"] },
  { id: "audit", label: "Audit", to: routes.audit, audience: ["admin", "approver"] },
  { id: "mail", label: "Mail", to: routes.mail, audience: ["admin"] },
  { id: "profile", label: "Profile", to: routes.profile, audience: "everyone" },
] as const satisfies readonly NavEntry[];

export type NavId = (typeof NAV)[number]["id"];

export function canSee(audience: Audience, roles: readonly Role[]): boolean {
  return audience === "everyone" || audience.some((r) => roles.includes(r));
}

export const audienceOf = (id: NavId): Audience => NAV.find((e) => e.id === id)?.audience ?? [];

export const visibleNav = (roles: readonly Role[]): NavEntry[] => NAV.filter((e) => canSee(e.audience, roles));
