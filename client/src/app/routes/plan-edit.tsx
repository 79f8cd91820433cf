import { useState } from "react";
import { Link, useParams } from "react-router-dom";
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { ErrorView } from "@/components/error-view";
import { Page } from "@/components/page";
import { Loading, Notice } from "@/components/notice";
import { paths } from "@/config/paths";
import { acceleratorsQuery } from "@/features/accelerators/api/list-accelerators";
import { useCurrentUser } from "@/features/auth/hooks/use-session";
import { PlanBudgetSheet } from "@/features/budgets/components/plan-budget-sheet";
import { plansQueries } from "@/features/plans/api/queries";
import { DraftEditor } from "@/features/plans/components/draft-editor";
import { STATE_LABELS } from "@/features/plans/components/state-badge";

export function PlanEditRoute() {
  const params = useParams();
  const id = Number(params.id);
  const n = Number(params.n);
  const user = useCurrentUser();
  const queryClient = useQueryClient();
  const [generation, setGeneration] = useState(0);
  const [reloading, setReloading] = useState(false);
  const plan = useQuery(plansQueries.detail(id));
  const revision = useQuery(plansQueries.revision(id, n));
  const accelerators = useQuery(acceleratorsQuery());
  const back = (
    <Link className="text-seaglass underline underline-offset-4" to={paths.plan(id, n)}>
      Back to the plan
    </Link>
  );

  if (plan.isError || revision.isError) {
    return <ErrorView title="Revision not found" message={(plan.error ?? revision.error)?.message} action={back} />;
  }
  if (!plan.data || !revision.data) return <Loading label="Loading the draft…" />;
  const r = revision.data;
  if (r.authorId !== user.id) {
    return (
      <ErrorView
        eyebrow="Roped off"
        testId="not-allowed"
        title="Not your draft"
        message={
          <p>Only the author of revision {n} edits it. Start a new revision from the plan page if you own the plan.</p>
        }
        action={back}
      />
    );
  }
  if (r.state !== "draft") {
    return (
      <ErrorView
        eyebrow="Laid and fixed"
        title="This revision is not a draft"
        message={
          <p>
            Revision {n} is “{STATE_LABELS[r.state]}”; only drafts change. Start a new revision to change the plan.
          </p>
        }
        action={back}
      />
    );
  }

  // After a 409, re-read the saved draft and start the editor again from it (a save of our own keeps the editor as it is).
  const reload = async () => {
    setReloading(true);
    await queryClient.refetchQueries({ queryKey: plansQueries.revision(id, n).queryKey });
    setReloading(false);
    setGeneration((g) => g + 1);
  };
  return (
    <Page
      title={`Edit ${plan.data.title}, revision ${n}`}
      lead={<>Changes are checked by the engine as you type and saved when you choose. {back}</>}
    >
      {reloading && <Notice>Reloading the saved draft…</Notice>}
      <DraftEditor
        key={generation}
        planId={id}
        revision={r}
        onReload={() => void reload()}
        afterStages={
          <>
            {/* budget sheet */}
            <PlanBudgetSheet model={r.content.model} accelerators={accelerators.data ?? []} />
          </>
        }
      />
    </Page>
  );
}
