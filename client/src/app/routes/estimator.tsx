import { useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { useSearchParams } from "react-router-dom";
import { Page } from "@/components/page";
import { useModelChoices } from "@/lib/api/models";
import { pickerHint, SearchBox } from "@/components/search-box";
import { acceleratorsQuery } from "@/features/accelerators/api/list-accelerators";
import { BudgetSheet } from "@/features/budgets/components/budget-sheet";
import { ModelPicker } from "@/features/budgets/components/model-picker";
import { estimatorContext } from "@/features/budgets/lib/estimator-context";
import { modelRequest, type ModelDraft } from "@/features/budgets/lib/model-draft";
import type { SheetDraft } from "@/features/budgets/lib/sheet-draft";
import { modelFromSearch, sheetFromSearch, toSearch } from "@/features/budgets/lib/url-state";

/** The budget sheet on its own: any model, any cluster, no plan. Every input lives in the URL, so a link reproduces the figures. */
export function EstimatorRoute() {
  const [params, setParams] = useSearchParams();
  const accelerators = useQuery(acceleratorsQuery());
  const model = modelFromSearch(params);
  const [search, setSearch] = useState("");
  const profiles = useModelChoices(search, model.kind === "profile" ? Number(model.modelId) || null : null);
  const sheet = sheetFromSearch(params);
  const write = (m: ModelDraft, s: SheetDraft) => setParams(toSearch(m, s), { replace: true });

  const profile = model.kind === "profile" ? profiles.profiles.find((p) => String(p.id) === model.modelId) : undefined;
  const context = estimatorContext(modelRequest(model), profile?.trainedContext, sheet.stages);

  return (
    <Page
      title="Budget estimator"
      lead="Tokens, compute, time, cost and memory of a staged context-extension run, for any model shape on any accelerator. The link in the address bar reproduces these figures."
    >
      <BudgetSheet
        mode="estimator"
        value={sheet}
        onChange={(next) => write(model, next)}
        context={context}
        accelerators={accelerators.data ?? []}
        csvName="ropewalk-estimate.csv"
        modelPanel={(issues) => (
          <ModelPicker
            value={model}
            onChange={(m) => write(m, sheet)}
            profiles={profiles.profiles}
            issues={issues}
            search={
              <SearchBox
                label="Find a profile"
                value={search}
                onChange={setSearch}
                placeholder="part of a name"
                hint={pickerHint(profiles.profiles.length, profiles.total, profiles.more, "profiles")}
              />
            }
          />
        )}
      />
    </Page>
  );
}
