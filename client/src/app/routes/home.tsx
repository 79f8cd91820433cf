import { Link } from "react-router-dom";
import { ROLES, type Role } from "@shared/schemas/common";
import { Page, Panel } from "@/components/page";
import { Chip } from "@/components/notice";
import { roleLabel } from "@/lib/format";
import { paths } from "@/config/paths";
import { useCurrentUser } from "@/features/auth/hooks/use-session";

type Pointer = { text: string; link?: { to: string; label: string } };

/** What each role does here, with the screen to start from. */
const POINTERS: Record<Role, Pointer> = {
  admin: {
    text: "Add colleagues, give them roles, and deactivate accounts that should no longer sign in.",
    link: { to: paths.users(), label: "Manage users" },
  },
  researcher: {
    text: "Import a model's configuration, compare rescaling methods pair by pair in the workbench, and draft a staged plan to send to inspection.",
    link: { to: paths.modelImport(), label: "Import a config.json" },
  },
  infra: {
    text: "Keep the accelerator catalog, and size the tokens, hours, cost and memory of each stage before anyone signs.",
    link: { to: paths.estimator(), label: "Open the estimator" },
  },
  approver: {
    text: "Inspect the revisions sent to you, question the figures, and pass the exact revision (its hash) that is ready for a tuning run, or send it back to the walk with a note.",
    link: { to: paths.review(), label: "Open the review queue" },
  },
  viewer: {
    text: "Read every plan as it stands, drafts and reviews included, with its figures and who signed which revision.",
    link: { to: paths.plans(), label: "Browse plans" },
  },
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
                <Link
                  to={pointer.link.to}
                  className="mt-3 inline-block text-body font-medium text-seaglass underline underline-offset-4"
                >
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
