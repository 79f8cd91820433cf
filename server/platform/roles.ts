import type { Role, SessionUser } from "../../shared/schemas";

/** True when the user holds at least one of the roles. Roles are explicit: admin does not imply the others. */
export const hasRole = (user: SessionUser, ...roles: Role[]) => roles.some((r) => user.roles.includes(r));
