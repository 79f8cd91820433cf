import type { Role } from "@shared/schemas/common";

/** Who may create, edit and delete profiles (the server's rule in models.router.ts; it checks again). */
export const PROFILE_EDITORS: readonly Role[] = ["researcher", "infra", "admin"];
export const canEditProfiles = (roles: readonly Role[]) => roles.some((r) => PROFILE_EDITORS.includes(r));
