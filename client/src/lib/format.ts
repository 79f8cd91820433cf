import type { Role } from "../../../shared/schemas/common";

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Admin",
  researcher: "Researcher",
  infra: "Infra lead",
  approver: "Approver",
  viewer: "Viewer",
};

export const roleLabel = (role: Role) => ROLE_LABELS[role];

/** "Researcher, Approver and Viewer" */
export function formatList(items: readonly string[]): string {
  if (items.length <= 1) return items.join("");
  return `${items.slice(0, -1).join(", ")} and ${items[items.length - 1]}`;
}

const dateFormat = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric" });

/** ISO timestamp → "3 Mar 2025"; anything unparseable is shown as given. */
export function formatDate(iso: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : dateFormat.format(date);
}
