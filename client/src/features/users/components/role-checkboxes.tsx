import { ROLES, type Role } from "@shared/schemas/common";
import { CheckboxGroup } from "@/components/checkbox-group";
import { roleLabel } from "@/lib/format";

const ROLE_DUTIES: Record<Role, string> = {
  admin: "manages accounts",
  researcher: "drafts scaling plans",
  infra: "owns budgets and accelerators",
  approver: "reviews and signs plans",
  // Viewers read every plan as it stands, drafts included (the API lets them), and change nothing.
  viewer: "reads every plan, drafts included; changes nothing",
};

/** One checkbox per role, with what the role does; the value is a Role[] (use through react-hook-form's Controller). */
export function RoleCheckboxes({
  value,
  onChange,
  error,
  legend = "Roles",
}: {
  value: Role[];
  onChange: (v: Role[]) => void;
  error?: string;
  legend?: string;
}) {
  return (
    <CheckboxGroup
      legend={legend}
      name="roles"
      options={ROLES}
      value={value}
      onChange={onChange}
      error={error}
      label={(role) => (
        <span>
          {roleLabel(role)} <span className="text-note text-ink-soft">— {ROLE_DUTIES[role]}</span>
        </span>
      )}
    />
  );
}
