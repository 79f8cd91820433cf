import { lazy } from "react";
import { createBrowserRouter, RouterProvider } from "react-router-dom";
import { RouteErrorBoundary } from "../components/error-view";
import { paths, routes } from "../config/paths";
import { AppLayout } from "./layout/app-layout";
import { RoleGate } from "./layout/role-gate";
import { SignInRoute } from "./routes/sign-in";

// Every screen but sign-in is its own chunk, fetched when first visited (AppLayout shows a Suspense fallback
// meanwhile): the first page pulls only the sign-in form, the layout and the libraries they use.
const AcceleratorsRoute = lazy(() => import("./routes/accelerators").then((m) => ({ default: m.AcceleratorsRoute })));
const AuditRoute = lazy(() => import("./routes/audit").then((m) => ({ default: m.AuditRoute })));
const MailRoute = lazy(() => import("./routes/mail").then((m) => ({ default: m.MailRoute })));
const PlanRoute = lazy(() => import("./routes/plan").then((m) => ({ default: m.PlanRoute })));
const PlanDiffRoute = lazy(() => import("./routes/plan-diff").then((m) => ({ default: m.PlanDiffRoute })));
const PlanEditRoute = lazy(() => import("./routes/plan-edit").then((m) => ({ default: m.PlanEditRoute })));
const PlanNewRoute = lazy(() => import("./routes/plan-new").then((m) => ({ default: m.PlanNewRoute })));
const PlansRoute = lazy(() => import("./routes/plans").then((m) => ({ default: m.PlansRoute })));
const ReviewRoute = lazy(() => import("./routes/review").then((m) => ({ default: m.ReviewRoute })));
const EstimatorRoute = lazy(() => import("./routes/estimator").then((m) => ({ default: m.EstimatorRoute })));
const HomeRoute = lazy(() => import("./routes/home").then((m) => ({ default: m.HomeRoute })));
const ModelsRoute = lazy(() => import("./routes/models").then((m) => ({ default: m.ModelsRoute })));
const ModelDetailRoute = lazy(() => import("./routes/models-detail").then((m) => ({ default: m.ModelDetailRoute })));
const ModelImportRoute = lazy(() => import("./routes/models-import").then((m) => ({ default: m.ModelImportRoute })));
const ModelNewRoute = lazy(() => import("./routes/models-new").then((m) => ({ default: m.ModelNewRoute })));
const NotFoundRoute = lazy(() => import("./routes/not-found").then((m) => ({ default: m.NotFoundRoute })));
const ProfileRoute = lazy(() => import("./routes/profile").then((m) => ({ default: m.ProfileRoute })));
const UsersRoute = lazy(() => import("./routes/users").then((m) => ({ default: m.UsersRoute })));
const WorkbenchRoute = lazy(() => import("./routes/workbench").then((m) => ({ default: m.WorkbenchRoute })));

// Each route has its own error boundary so one broken screen keeps the header and navigation.
const routeError = <RouteErrorBoundary homeHref={paths.home()} />;

export const router = createBrowserRouter([
  { path: routes.signIn, element: <SignInRoute />, errorElement: routeError },
  {
    element: <AppLayout />,
    errorElement: routeError,
    children: [
      { index: true, element: <HomeRoute />, errorElement: routeError },
      {
        path: routes.users,
        element: (
          <RoleGate screen="users">
            <UsersRoute />
          </RoleGate>
        ),
        errorElement: routeError,
      },
      { path: routes.profile, element: <ProfileRoute />, errorElement: routeError },
      { path: routes.models, element: <ModelsRoute />, errorElement: routeError },
      { path: routes.modelNew, element: <ModelNewRoute />, errorElement: routeError },
      { path: routes.modelImport, element: <ModelImportRoute />, errorElement: routeError },
      { path: routes.model, element: <ModelDetailRoute />, errorElement: routeError },
      { path: routes.workbench, element: <WorkbenchRoute />, errorElement: routeError },
      { path: routes.estimator, element: <EstimatorRoute />, errorElement: routeError },
      { path: routes.accelerators, element: <AcceleratorsRoute />, errorElement: routeError },
      { path: routes.plans, element: <PlansRoute />, errorElement: routeError },
      { path: routes.planNew, element: <PlanNewRoute />, errorElement: routeError },
      { path: routes.plan, element: <PlanRoute />, errorElement: routeError },
      { path: routes.planEdit, element: <PlanEditRoute />, errorElement: routeError },
      { path: routes.planDiff, element: <PlanDiffRoute />, errorElement: routeError },
      {
        path: routes.review,
        element: (
          <RoleGate screen="review">
            <ReviewRoute />
          </RoleGate>
        ),
        errorElement: routeError,
      },
      {
        path: routes.audit,
        element: (
          <RoleGate screen="audit">
            <AuditRoute />
          </RoleGate>
        ),
        errorElement: routeError,
      },
      {
        path: routes.mail,
        element: (
          <RoleGate screen="mail">
            <MailRoute />
          </RoleGate>
        ),
        errorElement: routeError,
      },
      { path: "*", element: <NotFoundRoute />, errorElement: routeError },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
