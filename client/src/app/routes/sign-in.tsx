import { Navigate, useNavigate, useSearchParams } from "react-router-dom";
import { AppShell } from "@/components/app-shell";
import { Notice } from "@/components/notice";
import { paths, safeNext } from "@/config/paths";
import { SignInForm } from "@/features/auth/components/sign-in-form";
import { useSession } from "@/features/auth/hooks/use-session";

export function SignInRoute() {
  const session = useSession();
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const next = safeNext(params.get("next"));

  // The form shows at once, while the session is still being read: a visitor who turns out to be signed in is
  // sent on when the answer comes (the form's first POST fetches the CSRF token itself if it is not known yet).
  if (session.data?.user) return <Navigate to={next} replace />;

  return (
    <AppShell homeHref={paths.home()}>
      <title>Sign in · Ropewalk</title>
      <div className="mx-auto grid max-w-4xl gap-10 py-6 md:grid-cols-[1fr_minmax(0,24rem)]">
        <div className="flex flex-col gap-4">
          <h1 className="text-display font-semibold leading-tight tracking-tight">Sign in to Ropewalk</h1>
          <p className="text-lead text-ink-soft">
            Compare ways to rescale rotary position embeddings for a longer context, cost the fine-tuning run, and carry
            a plan through review to sign-off.
          </p>
          <p className="text-body text-ink-soft">Accounts are made by an admin. If you do not have one, ask yours.</p>
        </div>
        <div className="rounded-lg border border-rule bg-white/60 p-6 shadow-[0_1px_0_var(--color-rule)]">
          {session.isError && (
            <div className="mb-4">
              <Notice tone="alert" title="Ropewalk is not answering">
                {session.error.message}
              </Notice>
            </div>
          )}
          {params.get("next") && <p className="mb-4 text-note text-seaglass">Sign in to continue where you were.</p>}
          <SignInForm onSignedIn={() => navigate(next, { replace: true })} />
        </div>
      </div>
    </AppShell>
  );
}
