import { useQuery } from "@tanstack/react-query";
import { auditQuerySchema } from "@shared/schemas/audit";
import { Page, Panel } from "@/components/page";
import { Loading, Notice } from "@/components/notice";
import { useSearchState } from "@/lib/search-state";
import { auditQueries } from "@/features/audit/api/queries";
import { useCurrentUser } from "@/features/auth/hooks/use-session";
import { AuditFilters } from "@/features/audit/components/audit-filters";
import { ChainStatus } from "@/features/audit/components/chain-status";
import { AuditTable } from "@/features/audit/components/audit-table";
import { Pager } from "@/components/pager";

const DEFAULT_PAGE_SIZE = 50;

export function AuditRoute() {
  const { params, update } = useSearchState(auditQuerySchema);
  const page = useQuery(auditQueries.page(params));
  const user = useCurrentUser();
  return (
    <Page
      title="Audit"
      lead="Every recorded action, newest first: who did what to which plan, token or account. The trail is append-only."
    >
      {user.roles.includes("admin") && (
        <Panel title="Seals">
          <ChainStatus />
        </Panel>
      )}
      <Panel title="Filter">
        <AuditFilters params={params} onChange={update} />
        {params.actorId && (
          <p className="mt-2 text-note text-ink-soft">
            Showing one person’s actions only (clear the filters to see everyone’s).
          </p>
        )}
      </Panel>
      {page.isPending && <Loading label="Loading the trail…" />}
      {page.isError && (
        <Notice tone="alert" title="Could not load the audit trail">
          {page.error.message}
        </Notice>
      )}
      {page.data && (
        <div className="flex flex-col gap-3">
          <AuditTable
            events={page.data.events}
            busy={page.isPlaceholderData}
            onActor={(actorId) => update({ actorId })}
            onSubject={(subjectType, subjectId) => update({ subjectType, subjectId })}
          />
          <Pager
            page={page.data.page}
            pageSize={params.pageSize ?? DEFAULT_PAGE_SIZE}
            total={page.data.total}
            totalCapped={page.data.totalCapped}
            cursor={{ rows: page.data.events.length, hasNext: page.data.nextBefore != null }}
            // Next and previous follow the server's cursors (as cheap at any depth, where a page number is an OFFSET
            // the server answers only for the first pages); page 1 is the top of the trail, without one.
            onPage={(p) => {
              const next = p === page.data.page + 1 ? page.data.nextBefore : null;
              const prev = p === page.data.page - 1 && p > 1 ? page.data.prevBefore : null;
              update({ page: p, before: next ?? prev ?? undefined });
            }}
            noun="Events"
          />
        </div>
      )}
    </Page>
  );
}
