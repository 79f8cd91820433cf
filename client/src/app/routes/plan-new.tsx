import { useState } from "react";
import { Link, useNavigate } from "react-router-dom";
import { useQuery } from "@tanstack/react-query";
import { ErrorView } from "@/components/error-view";
import { Page } from "@/components/page";
import { Loading, Notice } from "@/components/notice";
import { paths } from "@/config/paths";
import { useModelChoices } from "@/lib/api/models";
import { pickerHint, SearchBox } from "@/components/search-box";
import { acceleratorsQuery } from "@/features/accelerators/api/list-accelerators";
import { useCurrentUser } from "@/features/auth/hooks/use-session";
import { PlanBudgetSheet } from "@/features/budgets/components/plan-budget-sheet";
import { plansQueries } from "@/features/plans/api/queries";
import { NewPlanForm } from "@/features/plans/components/new-plan-form";

export function PlanNewRoute() {
  const user = useCurrentUser();
  const navigate = useNavigate();
  const [search, setSearch] = useState("");
  const [picked, setPicked] = useState<number | undefined>();
  const models = useModelChoices(search, picked);
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
          {models.error?.message}
        </Notice>
      )}
      {settings.isError && (
        <Notice tone="alert" title="Could not load the lab’s approval rule">
          {settings.error.message}
        </Notice>
      )}
      {!models.isPending && models.total === 0 && !search && (
        <Notice title="No model profiles yet">
          Import a model’s configuration first; a plan always extends one profile.
        </Notice>
      )}
      {!models.isPending && settings.data && (
        <NewPlanForm
          models={models.profiles}
          onModelPicked={setPicked}
          modelSearch={
            <div className="max-w-md">
              <SearchBox
                label="Find a model profile"
                value={search}
                onChange={setSearch}
                placeholder="part of a name"
                hint={pickerHint(models.profiles.length, models.total, models.more, "profiles")}
              />
            </div>
          }
          minApprovals={settings.data.minRequiredApprovals}
          onCreated={(plan) => navigate(paths.plan(plan.id))}
          // budget sheet: the budget engineer may pass a BudgetSheet here as well (it renders inside the form)
          afterStages={<PlanBudgetSheet models={models.profiles} accelerators={accelerators.data ?? []} />}
        />
      )}
    </Page>
  );
}
