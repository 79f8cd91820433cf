import { createBrowserRouter, RouterProvider } from "react-router-dom";
import { RouteErrorBoundary } from "../components/error-view";
import { paths, routes } from "../config/paths";
import { AppLayout } from "./layout/app-layout";
import { RoleGate } from "./layout/role-gate";
import { AcceleratorsRoute } from "./routes/accelerators";
import { AuditRoute } from "./routes/audit";
import { MailRoute } from "./routes/mail";
import { PlanRoute } from "./routes/plan";
import { PlanDiffRoute } from "./routes/plan-diff";
import { PlanEditRoute } from "./routes/plan-edit";
import { PlanNewRoute } from "./routes/plan-new";
import { PlansRoute } from "./routes/plans";
import { ReviewRoute } from "./routes/review";
import { EstimatorRoute } from "./routes/estimator";
import { HomeRoute } from "./routes/home";
import { ModelsRoute } from "./routes/models";
import { ModelDetailRoute } from "./routes/models-detail";
import { ModelImportRoute } from "./routes/models-import";
import { ModelNewRoute } from "./routes/models-new";
import { NotFoundRoute } from "./routes/not-found";
import { ProfileRoute } from "./routes/profile";
import { SignInRoute } from "./routes/sign-in";
import { UsersRoute } from "./routes/users";
import { WorkbenchRoute } from "./routes/workbench";

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
