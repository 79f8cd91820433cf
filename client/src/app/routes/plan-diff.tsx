import { Link, useParams, useSearchParams } from "react-router-dom";
import { useQuery } from "@tanstack/react-query";
import { SelectField } from "@/components/field";
import { Page } from "@/components/page";
import { Loading, Notice } from "@/components/notice";
import { paths } from "@/config/paths";
import { plansQueries } from "@/features/plans/api/queries";
import { DiffView } from "@/features/plans/components/diff-view";

export function PlanDiffRoute() {
  const id = Number(useParams().id);
  const [search, setSearch] = useSearchParams();
  const plan = useQuery(plansQueries.detail(id));
  const latest = plan.data?.latestRevision ?? 1;
  const b = Number(search.get("b")) || latest;
  const a = Number(search.get("a")) || Math.max(1, b - 1);
  const diff = useQuery({ ...plansQueries.diff(id, a, b), enabled: a > 0 && b > 0 && a !== b });
  const pick = (key: "a" | "b", value: string) =>
    setSearch((prev) => {
      const next = new URLSearchParams(prev);
      next.set("a", String(a));
      next.set("b", String(b));
      next.set(key, value);
      return next;
    });
  const numbers = plan.data?.revisions.map((r) => r.number) ?? [];

  return (
    <Page
      title={plan.data ? `${plan.data.title}: revisions side by side` : "Revisions side by side"}
      lead={
        <Link className="text-seaglass underline underline-offset-4" to={paths.plan(id)}>
          Back to the plan
        </Link>
      }
    >
      {plan.isError && (
        <Notice tone="alert" title="Could not load the plan">
          {plan.error.message}
        </Notice>
      )}
      {plan.data && (
        <div className="grid max-w-md grid-cols-2 gap-3" role="group" aria-label="Revisions to lay side by side">
          {(["a", "b"] as const).map((key) => (
            <SelectField
              key={key}
              label={key === "a" ? "Was (revision)" : "Now (revision)"}
              value={key === "a" ? a : b}
              onChange={(e) => pick(key, e.target.value)}
            >
              {numbers.map((n) => (
                <option key={n} value={n}>
                  Revision {n}
                </option>
              ))}
            </SelectField>
          ))}
        </div>
      )}
      {a === b && <Notice>Pick two different revisions to lay side by side.</Notice>}
      {diff.isPending && a !== b && <Loading label="Laying them side by side…" />}
      {diff.isError && (
        <Notice tone="alert" title="Could not lay them side by side">
          {diff.error.message}
        </Notice>
      )}
      {diff.data && <DiffView diff={diff.data} />}
    </Page>
  );
}
