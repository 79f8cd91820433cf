import { Link, useNavigate, useParams } from "react-router-dom";
import { useQuery } from "@tanstack/react-query";
import { ErrorView } from "@/components/error-view";
import { Loading } from "@/components/notice";
import { Page } from "@/components/page";
import { paths } from "@/config/paths";
import { isApiError } from "@/lib/api-client";
import { useCurrentUser } from "@/features/auth/hooks/use-session";
import { canEditProfiles, ProfileDetail } from "@/features/models";
import { modelsQueries } from "@/lib/api/models";
import { workbenchSearch } from "@/features/workbench";

export function ModelDetailRoute() {
  const id = Number(useParams().id);
  const user = useCurrentUser();
  const navigate = useNavigate();
  const model = useQuery({ ...modelsQueries.detail(id), enabled: Number.isInteger(id) && id > 0 });

  if (!Number.isInteger(id) || id <= 0 || (isApiError(model.error) && model.error.status === 404)) {
    return (
      <ErrorView
        title="No such profile"
        message="It may have been deleted."
        action={<Link to={paths.models()}>Back to profiles</Link>}
      />
    );
  }
  if (model.isPending) return <Loading label="Loading profile…" />;
  if (model.isError) return <ErrorView title="Could not load the profile" message={model.error.message} />;

  const m = model.data;
  return (
    <Page title={m.name} lead={m.provenance || undefined}>
      <ProfileDetail
        model={m}
        canEdit={canEditProfiles(user.roles)}
        onDeleted={() => navigate(paths.models(), { replace: true })}
        actions={
          <Link
            to={paths.workbench(workbenchSearch({ modelId: m.id, trainedContext: m.trainedContext }))}
            className="text-body font-medium underline underline-offset-4"
          >
            Open in the workbench
          </Link>
        }
      />
    </Page>
  );
}
