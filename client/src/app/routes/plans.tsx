import { useState } from "react";
import { Link } from "react-router-dom";
import { useQuery } from "@tanstack/react-query";
import { planListQuerySchema } from "@shared/schemas/plans";
import { Page, Panel } from "@/components/page";
import { Loading, Notice } from "@/components/notice";
import { paths } from "@/config/paths";
import { useModelChoices } from "@/lib/api/models";
import { pickerHint, SearchBox } from "@/components/search-box";
import { useSearchState } from "@/lib/search-state";
import { useCurrentUser } from "@/features/auth/hooks/use-session";
import { plansQueries } from "@/features/plans/api/queries";
import { PlanFilters } from "@/features/plans/components/plan-filters";
import { PlansTable } from "@/features/plans/components/plans-table";
import { Pager } from "@/components/pager";

const DEFAULT_PAGE_SIZE = 20;

export function PlansRoute() {
  const user = useCurrentUser();
  const { params, update } = useSearchState(planListQuerySchema);
  const list = useQuery(plansQueries.list(params));
  const [modelSearch, setModelSearch] = useState("");
  const models = useModelChoices(modelSearch, params.modelId);

  const ownerList = useQuery(plansQueries.owners());

  // Everyone who owns a plan, you marked; an owner chosen in the URL but not (yet) listed stays selectable.
  const owners = (ownerList.data ?? []).map((o) => (o.id === user.id ? { ...o, name: `${o.name} (you)` } : o));
  if (params.ownerId && !owners.some((o) => o.id === params.ownerId))
    owners.push({ id: params.ownerId, name: `Owner #${params.ownerId}` });

  return (
    <Page
      title="Plans"
      lead="Every staged extension plan, with the state of its latest revision. Signed revisions export the rope_scaling block."
    >
      {user.roles.includes("researcher") && (
        <div>
          <Link
            to={paths.planNew()}
            className="inline-flex rounded-md border border-hemp bg-hemp px-4 py-2 text-body font-medium text-paper no-underline hover:bg-hemp-dark"
          >
            New plan
          </Link>
        </div>
      )}
      <Panel title="Find a plan">
        <div className="mb-3 max-w-md">
          <SearchBox
            label="Find a model for the filter"
            value={modelSearch}
            onChange={setModelSearch}
            placeholder="part of a profile name"
            hint={pickerHint(models.profiles.length, models.total, models.more, "profiles")}
          />
        </div>
        <PlanFilters
          params={params}
          onChange={update}
          models={models.profiles.map((m) => ({ id: m.id, name: m.name }))}
          owners={owners}
        />
      </Panel>
      {list.isPending && <Loading label="Loading plans…" />}
      {list.isError && (
        <Notice tone="alert" title="Could not load plans">
          {list.error.message}
        </Notice>
      )}
      {list.data && (
        <div className="flex flex-col gap-3">
          <PlansTable
            plans={list.data.plans}
            total={list.data.total}
            sort={params.sort ?? "updatedAt"}
            dir={params.dir ?? "desc"}
            onSort={(sort, dir) => update({ sort, dir })}
            busy={list.isPlaceholderData}
          />
          <Pager
            page={list.data.page}
            pageSize={params.pageSize ?? DEFAULT_PAGE_SIZE}
            total={list.data.total}
            totalCapped={list.data.totalCapped}
            cursor={{ rows: list.data.plans.length, hasNext: list.data.nextAfter != null }}
            // Next and previous follow the server's cursors (as cheap at any depth, where a page number is an OFFSET
            // the server answers only for the first pages); page 1 is the top of the list, without one.
            onPage={(page) => {
              const next = page === list.data.page + 1 && list.data.nextAfter ? list.data.nextAfter : undefined;
              const prev =
                page === list.data.page - 1 && page > 1 && list.data.prevBefore ? list.data.prevBefore : undefined;
              update({ page, after: next, before: next ? undefined : prev });
            }}
            noun="Plans"
          />
        </div>
      )}
    </Page>
  );
}
