import { Link, useLocation } from "react-router-dom";
import { ErrorView } from "@/components/error-view";
import { paths } from "@/config/paths";

export function NotFoundRoute() {
  const { pathname } = useLocation();
  return (
    <ErrorView
      eyebrow="Loose end"
      testId="not-found"
      title="Page not found"
      message={
        <p>
          Nothing is laid out at <code className="rounded bg-paper-deep px-1">{pathname}</code>. The link may be old, or
          the address mistyped.
        </p>
      }
      action={
        <Link className="text-seaglass underline underline-offset-4" to={paths.home()}>
          Back to home
        </Link>
      }
    />
  );
}
