import type { UseFormRegisterReturn } from "react-hook-form";
import { ROLES, type Role } from "@shared/schemas/common";
import { Checkbox } from "@/components/field";
import { roleLabel } from "@/lib/format";

const ROLE_DUTIES: Record<Role, string> = {
  admin: "manages accounts",
  researcher: "drafts scaling plans",
  infra: "owns budgets and accelerators",
  approver: "reviews and signs plans",
  viewer: "reads signed plans",
};

/** One checkbox per role, all registered under one name so the form value is a Role[]. */
export function RoleCheckboxes({
  registration,
  error,
  legend = "Roles",
}: {
  registration: UseFormRegisterReturn;
  error?: string;
  legend?: string;
}) {
  return (
    <fieldset className="flex flex-col gap-2" aria-invalid={Boolean(error)}>
      <legend className="mb-1 text-note font-semibold text-ink">{legend}</legend>
      <div className="flex flex-wrap gap-x-5 gap-y-2">
        {ROLES.map((role) => (
          <Checkbox
            key={role}
            value={role}
            {...registration}
            label={
              <span>
                {roleLabel(role)} <span className="text-note text-ink-soft">— {ROLE_DUTIES[role]}</span>
              </span>
            }
          />
        ))}
      </div>
      {error && (
        <p className="text-note text-signal" role="alert">
          {error}
        </p>
      )}
    </fieldset>
  );
}
