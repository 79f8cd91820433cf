import { Link } from "react-router-dom";
import { ErrorView } from "@/components/error-view";
import { paths } from "@/config/paths";

/** Shown instead of the create/import screens to roles that may only read profiles. */
export function ProfileEditorsOnly() {
  return (
    <ErrorView
      eyebrow="Roped off"
      testId="not-allowed"
      title="Not allowed"
      message="Creating and importing profiles needs the researcher, infra lead or admin role. You can still read every profile and analyse it in the workbench."
      action={
        <Link className="text-seaglass underline underline-offset-4" to={paths.models()}>
          Back to profiles
        </Link>
      }
    />
  );
}
