import type { ReactNode } from "react";
import { isRouteErrorResponse, Link, useRouteError } from "react-router-dom";
import { isApiError } from "../lib/api-client";

type ErrorViewProps = { title: string; message: ReactNode; action?: ReactNode; testId?: string; eyebrow?: string };

export function ErrorView({ title, message, action, testId, eyebrow = "Frayed strand" }: ErrorViewProps) {
  return (
    <section className="mx-auto flex max-w-xl flex-col gap-3 py-10" data-testid={testId}>
      <title>{`${title} · Ropewalk`}</title>
      <p className="text-note font-semibold tracking-[0.2em] text-signal uppercase">{eyebrow}</p>
      <h1 className="text-display font-semibold leading-tight text-ink">{title}</h1>
      <div className="text-lead text-ink-soft">{message}</div>
      {action && <div className="pt-2">{action}</div>}
    </section>
  );
}

/** Rendered by the router when a route throws while loading or rendering. */
export function RouteErrorBoundary({ homeHref }: { homeHref: string }) {
  const error = useRouteError();
  let message =
    "An unexpected error stopped this page. Reload to try again; if it keeps happening, tell an admin what you were doing.";
  if (isRouteErrorResponse(error)) message = `${error.status} ${error.statusText}`;
  else if (isApiError(error)) message = error.message;
  return (
    <ErrorView
      title="This page came apart"
      message={message}
      testId="route-error"
      action={
        <Link className="text-seaglass underline underline-offset-4" to={homeHref}>
          Back to home
        </Link>
      }
    />
  );
}
