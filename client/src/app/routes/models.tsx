import { Link } from "react-router-dom";
import { useQuery } from "@tanstack/react-query";
import { Loading, Notice } from "@/components/notice";
import { Page, Panel } from "@/components/page";
import { paths } from "@/config/paths";
import { useCurrentUser } from "@/features/auth/hooks/use-session";
import { canEditProfiles, ModelsTable } from "@/features/models";
import { modelsQueries } from "@/lib/api/models";
import { Pager } from "@/components/pager";
import { SearchBox } from "@/components/search-box";
import { usePagedSearch } from "@/lib/use-paged-search";

const PAGE_SIZE = 50;

const linkButton =
  "inline-flex items-center rounded-md border px-4 py-2 text-body font-medium no-underline transition-colors";

export function ModelsRoute() {
  const user = useCurrentUser();
  const paged = usePagedSearch(PAGE_SIZE);
  const models = useQuery(modelsQueries.list(paged.query));
  const pager = models.data && paged.pager(models.data);
  const canEdit = canEditProfiles(user.roles);
  return (
    <Page
      title="Model profiles"
      lead="The rotary shape of each model Ropewalk analyses: head dimension, rotary fraction, base and trained context, plus the size figures budgets need."
    >
      {canEdit && (
        <div className="flex flex-wrap gap-3">
          <Link to={paths.modelImport()} className={`${linkButton} border-hemp bg-hemp text-paper hover:bg-hemp-dark`}>
            Import config.json
          </Link>
          <Link
            to={paths.modelNew()}
            className={`${linkButton} border-rule-strong bg-paper text-ink hover:border-hemp`}
          >
            Type a profile in
          </Link>
        </div>
      )}
      <Panel title="All profiles">
        <div className="mb-3 max-w-md">
          <SearchBox label="Find a profile" {...paged.searchBox} placeholder="part of a name" />
        </div>
        {models.isPending ? (
          <Loading label="Loading profiles…" />
        ) : models.isError ? (
          <Notice tone="alert" title="Could not load profiles">
            {models.error.message}
          </Notice>
        ) : (
          <div className="flex flex-col gap-3">
            <ModelsTable models={models.data.models} />
            {pager && <Pager {...pager} noun="Profiles" />}
          </div>
        )}
      </Panel>
    </Page>
  );
}
