import { Link } from "react-router-dom";
import { ROLES, type Role } from "../../../../shared/schemas/common";
import { Page, Panel } from "../../components/page";
import { Chip } from "../../components/notice";
import { roleLabel } from "../../lib/format";
import { paths } from "../../config/paths";
import { useCurrentUser } from "../../features/auth/hooks/use-session";

type Pointer = { text: string; link?: { to: string; label: string } };

/** What each role does here. Screens that do not exist yet are named without a link. */
const POINTERS: Record<Role, Pointer> = {
  admin: { text: "Add colleagues, give them roles, and deactivate accounts that should no longer sign in.", link: { to: paths.users(), label: "Manage users" } },
  researcher: { text: "Import a model's configuration, compare rescaling methods pair by pair, and draft a plan for review. The workbench arrives next." },
  infra: { text: "Set compute budgets and describe the accelerators a plan may use, so every plan carries a cost you can trust." },
  approver: { text: "Review submitted plans, question the figures, and sign the ones ready for a tuning run." },
  viewer: { text: "Read signed plans and the reasoning behind them." },
};

export function HomeRoute() {
  const user = useCurrentUser();
  const roles = ROLES.filter((r) => user.roles.includes(r));
  return (
    <Page
      title={`Good to see you, ${user.name}`}
      lead="Ropewalk keeps the decision of how to rescale RoPE for a longer context in one place: the method, its figures, its cost, and who signed it."
    >
      <div className="flex flex-wrap items-center gap-2" aria-label="Your roles">
        <span className="text-note font-semibold tracking-wide text-ink-soft uppercase">Your roles</span>
        {roles.map((r) => (
          <Chip key={r}>{roleLabel(r)}</Chip>
        ))}
      </div>
      <div className="grid gap-4 md:grid-cols-2">
        {roles.map((role) => {
          const pointer = POINTERS[role];
          return (
            <Panel key={role} title={`As ${roleLabel(role).toLowerCase()}`}>
              <p className="text-body text-ink">{pointer.text}</p>
              {pointer.link && (
                <Link to={pointer.link.to} className="mt-3 inline-block text-body font-medium text-seaglass underline underline-offset-4">
                  {pointer.link.label}
                </Link>
              )}
            </Panel>
          );
        })}
      </div>
    </Page>
  );
}
