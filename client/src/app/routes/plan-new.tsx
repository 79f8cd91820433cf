import { Link, useNavigate } from "react-router-dom";
import { useQuery } from "@tanstack/react-query";
import { ErrorView } from "@/components/error-view";
import { Page } from "@/components/page";
import { Loading, Notice } from "@/components/notice";
import { paths } from "@/config/paths";
import { modelsQueries } from "@/lib/api/models";
import { acceleratorsQuery } from "@/features/accelerators/api/list-accelerators";
import { useCurrentUser } from "@/features/auth/hooks/use-session";
import { PlanBudgetSheet } from "@/features/budgets/components/plan-budget-sheet";
import { plansQueries } from "@/features/plans/api/queries";
import { NewPlanForm } from "@/features/plans/components/new-plan-form";

export function PlanNewRoute() {
  const user = useCurrentUser();
  const navigate = useNavigate();
  const models = useQuery(modelsQueries.list());
  const settings = useQuery(plansQueries.settings());
  const accelerators = useQuery(acceleratorsQuery());

  if (!user.roles.includes("researcher")) {
    return (
      <ErrorView
        eyebrow="Roped off"
        testId="not-allowed"
        title="Not allowed"
        message={<p>Drafting a plan needs the researcher role. Ask an admin to add it if you need it.</p>}
        action={
          <Link className="text-seaglass underline underline-offset-4" to={paths.plans()}>
            Back to plans
          </Link>
        }
      />
    );
  }

  return (
    <Page
      title="New plan"
      lead="Name the plan, pick the model it extends, and lay out the first revision. It is saved on the walk (a draft); send it to inspection from its page."
    >
      {(models.isPending || settings.isPending) && <Loading />}
      {models.isError && (
        <Notice tone="alert" title="Could not load model profiles">
          {models.error.message}
        </Notice>
      )}
      {settings.isError && (
        <Notice tone="alert" title="Could not load the lab’s approval rule">
          {settings.error.message}
        </Notice>
      )}
      {models.data && models.data.length === 0 && (
        <Notice title="No model profiles yet">
          Import a model’s configuration first; a plan always extends one profile.
        </Notice>
      )}
      {models.data && settings.data && (
        <NewPlanForm
          models={models.data}
          minApprovals={settings.data.minRequiredApprovals}
          onCreated={(plan) => navigate(paths.plan(plan.id))}
          // budget sheet: the budget engineer may pass a BudgetSheet here as well (it renders inside the form)
          afterStages={<PlanBudgetSheet models={models.data} accelerators={accelerators.data ?? []} />}
        />
      )}
    </Page>
  );
}
