import { Suspense, useState } from "react";
import { Navigate, Outlet, useLocation, useNavigate } from "react-router-dom";
import { AppShell } from "@/components/app-shell";
import { Button } from "@/components/button";
import { ErrorView } from "@/components/error-view";
import { Loading } from "@/components/notice";
import { paths } from "@/config/paths";
import { useLogout } from "@/features/auth/api/logout";
import { useSession } from "@/features/auth/hooks/use-session";
import { visibleNav } from "../nav";
import { NavStrand } from "./nav-strand";

/** Everything behind sign-in. A signed-out visitor is sent to sign-in and brought back after. */
export function AppLayout() {
  const session = useSession();
  const location = useLocation();
  const navigate = useNavigate();
  const logout = useLogout();
  // Set before logging out, so the redirect after an explicit sign-out carries no "back to".
  const [signingOut, setSigningOut] = useState(false);

  if (session.isPending)
    return (
      <AppShell homeHref={paths.home()}>
        <Loading />
      </AppShell>
    );
  if (session.isError) {
    return (
      <AppShell homeHref={paths.home()}>
        <ErrorView
          title="Ropewalk is not answering"
          message={session.error.message}
          action={<Button onClick={() => session.refetch()}>Try again</Button>}
        />
      </AppShell>
    );
  }
  const user = session.data.user;
  if (!user) {
    const here = `${location.pathname}${location.search}${location.hash}`;
    return <Navigate to={signingOut ? paths.signIn() : paths.signIn(here)} replace />;
  }

  const signOut = () => {
    setSigningOut(true);
    logout.mutate(undefined, {
      onSuccess: () => navigate(paths.signIn(), { replace: true }),
      onError: () => setSigningOut(false),
    });
  };

  const account = (
    <div className="flex items-center gap-3">
      <span className="hidden text-body text-paper/85 sm:inline" data-testid="signed-in-as">
        {user.name}
      </span>
      <Button variant="secondary" size="sm" onClick={signOut} busy={logout.isPending}>
        Sign out
      </Button>
    </div>
  );

  return (
    <AppShell homeHref={paths.home()} account={account} nav={<NavStrand entries={visibleNav(user.roles)} />}>
      {/* screens are loaded on first visit (router.tsx); the header stays while one arrives */}
      <Suspense fallback={<Loading />}>
        <Outlet />
      </Suspense>
    </AppShell>
  );
}
