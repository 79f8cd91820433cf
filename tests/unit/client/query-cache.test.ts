import { describe, expect, it } from "vitest";
import { QueryClient } from "@tanstack/react-query";
import { ESLint } from "eslint";
import { apiPaths } from "../../../client/src/config/paths";
import { afterModelDeleted, afterModelSaved, modelsQueries } from "../../../client/src/lib/api/models";
import { analysesQueries } from "../../../client/src/lib/api/analyses";
import { budgetEstimateQueries } from "../../../client/src/lib/api/budgets";
import { afterCatalogChanged } from "../../../client/src/features/accelerators/api/save-accelerator";
import { acceleratorsKeys } from "../../../client/src/features/accelerators/api/keys";
import type { BudgetEstimateRequest } from "../../../shared/schemas/budget";
import type { ModelProfile } from "../../../shared/schemas/models";
import type { AnalysisRequest } from "../../../shared/schemas/analysis";

/*
 * One name, one fetcher and one cache per resource. Before this, GET /api/models had three names in paths.ts
 * (models, planModelChoices, budgetModelChoices) behind three query keys, and saving a profile refreshed one of them;
 * POST /api/analyses had two names and two caches.
 */
describe("apiPaths: one name per API address", () => {
  it("no two names build the same address", () => {
    const byUrl = new Map<string, string[]>();
    for (const [name, build] of Object.entries(apiPaths)) {
      // Sample arguments 1, 2, 3: ids and revision numbers differ, `download`/`save` flags are truthy.
      const url = (build as (...args: unknown[]) => string)(1, 2, 3);
      byUrl.set(url, [...(byUrl.get(url) ?? []), name]);
    }
    const shared = [...byUrl.entries()].filter(([, names]) => names.length > 1);
    expect(shared).toEqual([]);
  });
});

const profile = { id: 7, name: "Hawser 7B" } as ModelProfile;
const request: AnalysisRequest = {
  model: { modelId: 7 },
  targetContext: 32768,
  methods: [],
} as unknown as AnalysisRequest;

// An estimate names its profile and accelerator by id; the server reads their current figures each time.
const estimateRequest = { model: { modelId: 7 }, cluster: { acceleratorId: 3 } } as unknown as BudgetEstimateRequest;

function seeded() {
  const client = new QueryClient();
  client.setQueryData(modelsQueries.list().queryKey, {
    models: [profile],
    total: 1,
    totalCapped: false,
    page: 1,
    pageSize: 50,
  } as never);
  client.setQueryData(modelsQueries.detail(7).queryKey, profile);
  client.setQueryData(analysesQueries.detail(request).queryKey, { figures: "old" } as never);
  client.setQueryData(budgetEstimateQueries.detail(estimateRequest).queryKey, { stages: "old" } as never);
  client.setQueryData(acceleratorsKeys.list(), [] as never);
  return client;
}
const invalidated = (client: QueryClient, key: readonly unknown[]) => client.getQueryState(key)?.isInvalidated;

describe("model profiles: one cache, invalidated through the factory", () => {
  it("keys run general to specific under one root", () => {
    expect(modelsQueries.list().queryKey).toEqual(["models", "list", {}]);
    expect(modelsQueries.list({ q: "gan", page: 2 }).queryKey).toEqual(["models", "list", { q: "gan", page: 2 }]);
    expect(modelsQueries.detail(7).queryKey).toEqual(["models", "detail", 7]);
    expect(analysesQueries.detail(request).queryKey).toEqual(["analyses", request]);
  });

  it("saving a profile stores its detail and refreshes the list every page reads and the analyses that used it", async () => {
    const client = seeded();
    const renamed = { ...profile, name: "Hawser 7B long" };
    await afterModelSaved(client, renamed);
    expect(client.getQueryData(modelsQueries.detail(7).queryKey)).toEqual(renamed);
    expect(invalidated(client, modelsQueries.list().queryKey)).toBe(true);
    expect(invalidated(client, analysesQueries.detail(request).queryKey)).toBe(true);
    expect(invalidated(client, budgetEstimateQueries.detail(estimateRequest).queryKey)).toBe(true);
  });

  it("deleting a profile drops its detail and refreshes the list", async () => {
    const client = seeded();
    await afterModelDeleted(client, 7);
    expect(client.getQueryState(modelsQueries.detail(7).queryKey)).toBeUndefined();
    expect(invalidated(client, modelsQueries.list().queryKey)).toBe(true);
    expect(invalidated(client, budgetEstimateQueries.detail(estimateRequest).queryKey)).toBe(true);
  });
});

describe("budget estimates: cached as never stale, refreshed when what they read changes", () => {
  // The defect: editing an accelerator's price or a profile's layers left the estimator showing the old figures.
  it("an accelerator change refreshes the catalog and every estimate", async () => {
    const client = seeded();
    expect(invalidated(client, budgetEstimateQueries.detail(estimateRequest).queryKey)).toBe(false);
    await afterCatalogChanged(client);
    expect(invalidated(client, acceleratorsKeys.list())).toBe(true);
    expect(invalidated(client, budgetEstimateQueries.detail(estimateRequest).queryKey)).toBe(true);
    expect(invalidated(client, analysesQueries.detail(request).queryKey)).toBe(false);
  });
});

describe("lint: query keys are written only by the query factories", () => {
  const eslint = new ESLint();
  const source = `import { useQuery } from "@tanstack/react-query";\nexport const useX = () => useQuery({ queryKey: ["models", "list"], queryFn: () => 1 });\n`;
  const CASES: [file: string, refused: boolean][] = [
    ["client/src/app/routes/x.tsx", true],
    ["client/src/features/plans/components/x.tsx", true],
    ["client/src/features/plans/api/x.ts", false],
    ["client/src/lib/api/x.ts", false],
  ];
  it.each(CASES)("a literal key in %s: refused=%s", async (filePath, refused) => {
    const [result] = await eslint.lintText(source, { filePath });
    const hits = result.messages.filter((m) => m.ruleId === "no-restricted-syntax");
    expect(hits.length > 0).toBe(refused);
  });
});
