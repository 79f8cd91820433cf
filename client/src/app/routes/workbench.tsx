import { useState } from "react";
import { useSearchParams } from "react-router-dom";
import { Loading, Notice } from "@/components/notice";
import { Page } from "@/components/page";
import { apiPaths } from "@/config/paths";
import { ImportWarnings } from "@/features/models";
import { useModelChoices } from "@/lib/api/models";
import { pickerHint, SearchBox } from "@/components/search-box";
import { Workbench } from "@/features/workbench";

/** The workbench, fed with the saved profiles; a profile imported from a file shows the warnings its import raised. */
export function WorkbenchRoute() {
  const [params] = useSearchParams();
  const [search, setSearch] = useState("");
  const models = useModelChoices(search, Number(params.get("model")) || null);
  return (
    <Page
      title="Workbench"
      lead="Pick a model and a target length, then compare rotary scaling methods pair by pair: what each does to every frequency, which pairs it puts at risk, and the config keys it needs."
    >
      {models.isPending ? (
        <Loading label="Loading profiles…" />
      ) : models.isError ? (
        <Notice tone="alert" title="Could not load profiles">
          {models.error?.message}
        </Notice>
      ) : (
        <Workbench
          profiles={models.profiles}
          profileSearch={
            <SearchBox
              label="Find a profile"
              value={search}
              onChange={setSearch}
              placeholder="part of a name"
              hint={pickerHint(models.profiles.length, models.total, models.more, "profiles")}
            />
          }
          profileNotes={(p) =>
            p.sourceFileName ? (
              <details
                className="rounded-md border border-hemp/30 bg-hemp-pale/30 px-3 py-2"
                open={p.importWarnings.length > 0}
              >
                <summary className="cursor-pointer text-body font-medium text-hemp-dark">
                  {p.importWarnings.length} {p.importWarnings.length === 1 ? "warning was" : "warnings were"} raised
                  when the config of {p.name} was imported
                </summary>
                <div className="mt-2">
                  <ImportWarnings
                    warnings={p.importWarnings}
                    sourceHref={apiPaths.modelSource(p.id)}
                    sourceFileName={p.sourceFileName}
                    title={null}
                    columns={2}
                  />
                </div>
              </details>
            ) : null
          }
        />
      )}
    </Page>
  );
}
