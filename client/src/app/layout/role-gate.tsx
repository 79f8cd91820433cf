import type { ReactNode } from "react";
import { Link } from "react-router-dom";
import { ErrorView } from "@/components/error-view";
import { formatList, roleLabel } from "@/lib/format";
import { paths } from "@/config/paths";
import { useCurrentUser } from "@/features/auth/hooks/use-session";
import { audienceOf, canSee, NAV, type NavId } from "../nav";

/**
 * Shows the screen only to roles its nav entry allows. The server enforces the same rule on
 * every request; this gate just explains it instead of showing a page of failed requests.
 */
export function RoleGate({ screen, children }: { screen: NavId; children: ReactNode }) {
  const user = useCurrentUser();
  const audience = audienceOf(screen);
  if (canSee(audience, user.roles)) return children;
  const label = NAV.find((e) => e.id === screen)?.label ?? screen;
  // Any one of the listed roles opens the screen, so they are alternatives: "the admin or approver role".
  const needed = audience === "everyone" ? [] : audience.map((r) => roleLabel(r).toLowerCase());
  return (
    <ErrorView
      eyebrow="Roped off"
      testId="not-allowed"
      title="Not allowed"
      message={
        <>
          <p>
            {label} is not allowed for your roles ({formatList(user.roles.map((r) => roleLabel(r).toLowerCase()))}). It
            needs the {formatList(needed, "or")} role.
          </p>
          <p className="mt-2 text-body">If you need it, ask an admin to add the role to your account.</p>
        </>
      }
      action={
        <Link className="text-seaglass underline underline-offset-4" to={paths.home()}>
          Back to home
        </Link>
      }
    />
  );
}
