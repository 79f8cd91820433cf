import path from "node:path";
import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { launchBrowser, screenshot, SCREENSHOT_DIR, requireBuiltClient, downloadedText } from "../setup/browser";
import { makeTestApp, type Agent } from "../setup/app";
import { createPlan, createProfile, post, put } from "../setup/plans";
import { signedInPages } from "../setup/signed-in";
import { startTestServer } from "../setup/server";
import { createTestUser, type TestUser } from "../setup/users";

// The browser works the real built client served by the real app; setup goes through the API on the same database.
const GIB = 2 ** 30;

let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Browser;
let planner: TestUser;
let api: Agent;
let profile: { id: number; name: string };
const { signedIn, closeAll, errors } = signedInPages(
  () => browser,
  () => server.url,
  { width: 1280 },
);

beforeAll(async () => {
  requireBuiltClient();
  // One person who both keeps the catalog and authors the plan: only a draft's author may edit it.
  [server, browser, planner] = await Promise.all([
    startTestServer(),
    launchBrowser(),
    createTestUser(["researcher", "infra"], "Ines Infra-Researcher"),
  ]);
  api = await makeTestApp().signIn(planner);
  // Sample profile (tests/fixtures/profiles.ts): N = 6.5e9, 32 layers, 32 heads of 128, 8 KV heads, hidden 4096, 2 bytes.
  profile = await createProfile(api);
});

afterAll(async () => {
  await closeAll();
  await browser?.close();
  await server?.close();
});

/** A catalog entry through the API: 48 GiB, 300 TFLOP/s dense peak, 3 per hour unless told otherwise. */
async function catalogEntry(prefix: string, over: Record<string, unknown> = {}): Promise<string> {
  const name = `${prefix}-${Date.now().toString(36)}`;
  await post(api, "/api/accelerators", {
    name,
    memoryBytes: 48 * GIB,
    peakFlops: 300e12,
    pricePerHour: 3,
    ...over,
  }).expect(201);
  return name;
}

const totalText = (page: Page, name: string) => page.getByTestId(`total-${name}`).textContent();

/** Waits until the figures are current (no "Recomputing…", not dimmed) and answers the tokens total. */
async function settledTokens(page: Page): Promise<string | null> {
  await page.waitForFunction(() => {
    const figures = document.querySelector('[data-testid="estimate-figures"]');
    return figures && figures.getAttribute("aria-busy") === null;
  });
  return totalText(page, "tokens");
}

describe("budget sheet in a browser", () => {
  it("an infra lead adds an accelerator in the catalog; the estimator costs stages on it and downloads the table", async () => {
    const page = await signedIn(planner, "/accelerators");
    await page.getByRole("heading", { level: 1, name: "Accelerators" }).waitFor();

    const name = `Testbed-${Date.now().toString(36)}`;
    const form = page.getByRole("form", { name: "Add an accelerator" });
    // The shared schema speaks before the server is asked.
    await form.getByRole("button", { name: "Add accelerator" }).click();
    // The schema's check runs asynchronously after the click: wait for the first flagged field, not a count at once.
    await form.locator('[aria-invalid="true"]').first().waitFor();
    await form.getByLabel("Name").fill(name);
    await form.getByLabel("Memory (GiB)").fill("48");
    await form.getByLabel("Dense peak (TFLOP/s)").fill("300");
    await form.getByLabel("Price per accelerator-hour").fill("3");
    await form.getByLabel("Notes").fill("invented test hardware");
    await form.getByRole("button", { name: "Add accelerator" }).click();
    await page.getByText(`Added ${name} to the catalog.`).waitFor();
    const row = page.getByRole("table", { name: "Accelerators" }).locator("tbody tr").filter({ hasText: name });
    await expect(row.textContent()).resolves.toMatch(/48.*300.*3\.00/);

    // The API holds the figures in base units: 48 GiB in bytes, 300 TFLOP/s in FLOP/s.
    const list = await api.get("/api/accelerators").expect(200);
    const stored = list.body.accelerators.find((a: any) => a.name === name);
    expect(stored).toMatchObject({ memoryBytes: 48 * GIB, peakFlops: 300e12, pricePerHour: 3 });

    // Edit: the form opens with the stored figures in GiB and TFLOP/s; a new price is saved.
    await page.getByRole("button", { name: `Edit ${name}` }).click();
    const edit = page.getByRole("form", { name: `Edit ${name}` });
    await expect(edit.getByLabel("Memory (GiB)").inputValue()).resolves.toBe("48");
    await expect(edit.getByLabel("Dense peak (TFLOP/s)").inputValue()).resolves.toBe("300");
    await edit.getByLabel("Price per accelerator-hour").fill("3.5");
    await edit.getByRole("button", { name: "Save changes" }).click();
    await page.getByText(`Saved ${name}.`).waitFor();
    await expect.poll(() => row.textContent()).toContain("3.50");

    // Delete asks first, then the row goes.
    const spare = await catalogEntry("Spare", { memoryBytes: 16 * GIB });
    await page.reload();
    await page.getByRole("button", { name: `Delete ${spare}` }).click();
    await page
      .getByRole("alert")
      .getByRole("button", { name: `Delete ${spare}` })
      .click();
    await page.getByText(`Deleted ${spare}.`).waitFor();
    // The notice comes with the mutation's answer; the row goes with the list's refetch after it.
    await expect
      .poll(
        () => page.getByRole("table", { name: "Accelerators" }).locator("tbody tr").filter({ hasText: spare }).count(),
        { timeout: 15_000 },
      )
      .toBe(0);
    await screenshot(page, "accelerators");

    // A bare visit: example cluster figures, said to be examples, and no figures until a model is chosen.
    await page.goto(`${server.url}/estimator`);
    await page.getByTestId("example-figures").waitFor();
    await page.getByText("Pick a model profile or type a model shape to see figures.").waitFor();

    // Estimator: stage 1 by steps, stage 2 by a token target; inputs come from the URL.
    const search = new URLSearchParams([
      ["model", String(profile.id)],
      ["acc", String(stored.id)],
      ["n", "8"],
      ["st", "16384_64_200"],
      ["st", "32768_32_t1e9"],
    ]);
    await page.goto(`${server.url}/estimator?${search}`);
    await page.getByRole("heading", { level: 1, name: "Budget estimator" }).waitFor();
    // Tokens = steps × global batch × sequence length (docs/budget-conventions.md); a token target takes whole steps:
    // ceil(1e9 / (32 × 32768)) = 954 steps → 1 000 341 504 tokens; plus 200 × 64 × 16384 = 209 715 200.
    await expect(settledTokens(page)).resolves.toBe("1.21 billion");
    await page.getByText("954 whole steps").waitFor();
    await expect.poll(() => page.getByTestId("convention-formula").textContent()).toContain("Kaplan et al. 2020");
    await expect.poll(() => page.getByTestId("assumptions").textContent()).toContain("0.400 (assumed)");
    // Each convention is stated once; the figures link to it instead of repeating it.
    await expect.poll(() => page.locator("#budget-convention-activations").count()).toBe(1);
    await expect.poll(() => page.getByTestId("convention-links").count()).toBeGreaterThan(1);
    await expect(page.getByTestId("assumptions").textContent()).resolves.toContain("Korthikanti et al. 2022");
    // Every cost carries the workspace currency (an ISO code).
    await expect(page.getByTestId("total-cost").textContent()).resolves.toMatch(/ [A-Z]{3}$/);
    await page.getByText("These are estimates").first().waitFor();

    const [download] = await Promise.all([
      page.waitForEvent("download"),
      page.getByRole("button", { name: "Download the stage table (CSV)" }).click(),
    ]);
    expect(download.suggestedFilename()).toBe("ropewalk-estimate.csv");
    const csv = Papa.parse<Record<string, string>>(await downloadedText(download), {
      header: true,
      skipEmptyLines: true,
    });
    expect(csv.data.map((r) => r.stage)).toEqual(["1", "2", "total"]);
    const [s1, s2, total] = csv.data;
    expect(Number(s1.tokens)).toBe(200 * 64 * 16384);
    expect(Number(s2.steps)).toBe(954);
    expect(Number(total.tokens)).toBe(200 * 64 * 16384 + 954 * 32 * 32768);
    // Kaplan et al. 2020, Eq. 2.2 with training ≈ 3 × forward: 6N + 6·n_layer·n_ctx·d_attn, d_attn = 32 × 128;
    // × 4/3 for the default full checkpointing (one more forward pass).
    expect(Number(s1["FLOPs per token"])).toBeCloseTo(((6 * 6.5e9 + 6 * 32 * 16384 * 4096) * 4) / 3, -3);
    expect(s1["activation checkpointing"]).toBe("full");
    // Accelerator-hours = FLOPs / (peak × utilisation × 3600) with the default utilisation 0.4.
    expect(Number(s1["accelerator-hours"])).toBeCloseTo(Number(s1.FLOPs) / (300e12 * 0.4 * 3600), 6);
    expect(s1["FLOP convention"]).toContain("causal");

    // Switching to the full count (PaLM, App. B) raises the attention term: 12·n_layer·n_heads·head_dim·n_ctx.
    const before = await totalText(page, "compute");
    // click, not check(): the choice goes through the URL, so the radio turns on a moment after the click.
    await page.getByLabel(/^Full \(every position/).click();
    await page.waitForFunction(
      (b) => document.querySelector('[data-testid="total-compute"]')?.textContent !== b,
      before,
    );
    await expect.poll(() => page.getByTestId("convention-formula").textContent()).toContain("Chowdhery et al. 2022");
    expect(new URL(page.url()).searchParams.get("conv")).toBe("full");

    // A published recipe adds a stage labelled as the paper's own run, with its source.
    await page.getByText("Start from a published recipe").click();
    await page.getByRole("button", { name: "Use YaRN fine-tune" }).click();
    await expect
      .poll(() => page.getByTestId("recipe-label-2").textContent())
      .toMatch(/As reported.*Peng.*2023.*not a prediction/);
    await expect.poll(() => page.getByLabel("Stage 3 sequence length").inputValue()).toBe("65536");
    await page.getByTestId("stage-chart").waitFor();
    await page.getByTestId("growth-chart").waitFor();
    await settledTokens(page);
    await screenshot(page, "estimator");

    expect(errors).toEqual([]);
    await page.context().close();
  }, 90_000);

  it("the plan's author costs the draft on that accelerator, sees a stage not fit, fixes it and saves", async () => {
    // Its own catalog entry through the API (the form is exercised above), so this test also runs alone.
    const acceleratorName = await catalogEntry("Plan-bed");
    const yarn = { method: "yarn" as const };
    const stage = (targetContext: number, sequenceLength: number, globalBatch: number) => ({
      targetContext,
      method: yarn,
      steps: 100,
      globalBatch,
      sequenceLength,
      learningRate: 2e-5,
      dataMix: "books",
    });
    const created = await createPlan(api, profile.id, {
      revision: {
        targetContext: 131072,
        method: yarn,
        stages: [stage(65536, 65536, 64), stage(131072, 131072, 32)],
        notes: "budget browser test",
        acceptance: [
          {
            evaluation: "passkey retrieval",
            contextLength: 131072,
            metric: "accuracy",
            comparison: ">=",
            threshold: 0.9,
          },
        ],
      },
    });
    const editUrl = `/plans/${created.id}/revisions/1/edit`;
    const page = await signedIn(planner, editUrl);
    const sheet = page.getByRole("region", { name: "Budget sheet" });
    await sheet.getByText("Pick an accelerator to cost this plan").waitFor();

    await sheet.getByLabel("Catalog accelerator").selectOption({ label: acceleratorName });
    await sheet.getByLabel("Accelerators", { exact: true }).fill("32");
    // 100 × 64 × 65536 + 100 × 32 × 131072 = 838 860 800 tokens.
    await expect(settledTokens(page)).resolves.toBe("839 million");

    // The 128k stage on 32 accelerators of 48 GiB, full checkpointing and flash attention by default
    // (Korthikanti et al. 2022, Table 2; docs/budget-conventions.md), s = 131 072, h = 4096, l = 32:
    //   model states 6.5e9 × 16 ÷ 32 = 3.25e9, checkpoints 2·s·h·l = 34 359 738 368, workspace 34·s·h = 18 253 611 008
    //   → 55.9e9 > 48 GiB (51.5e9): the checkpoints (32 GiB) are the largest term; context parallelism 2 halves s:
    //   6.5e9 + 17.2e9 + 9.1e9 = 32.8e9 fits.
    const misfit = sheet.getByRole("alert").filter({ hasText: "Stage 2 does not fit in accelerator memory" });
    await misfit.waitFor();
    await expect
      .poll(() => misfit.textContent())
      .toMatch(
        /largest term is the activation checkpoints \(32 GiB\).*cheapest change that fits: context parallelism 2 \(/,
      );
    // With the vocabulary the logits count: 131 072 × 128 256 × 4 = 67 243 081 728 bytes (62.6 GiB), now the largest;
    // cheapest fit: degree 2 and 2 chunks, 6.5e9 + 17.2e9 + 9.1e9 + 33.6e9 ÷ 2 = 49.6e9 ≤ 51.5e9.
    await sheet.getByLabel("Vocabulary size", { exact: true }).fill("128256");
    await expect
      .poll(() => misfit.textContent())
      .toMatch(/largest term is the logits \(62\.6 GiB\).*context parallelism 2 and loss chunks 2/);
    // The sheet edits the plan's own stage: the stage field above shows its length.
    await expect(
      page.getByRole("group", { name: "Stage 2" }).getByLabel("Sequence length (tokens)").inputValue(),
    ).resolves.toBe("131072");
    await screenshot(page, "plan-budget-misfit");
    // The sheet alone, for a person checking the warning and the figures without scrolling the whole editor.
    await sheet.screenshot({ path: path.join(SCREENSHOT_DIR, "plan-budget-sheet-misfit.png"), animations: "disabled" });

    // Raise context parallelism and loss chunks: 6.5e9 + 17.2e9 + 9.1e9 + 33.6e9 ÷ 8 = 37.0e9 — it fits.
    await sheet.getByLabel("Context parallelism", { exact: true }).fill("2");
    await sheet.getByLabel("Loss chunks", { exact: true }).fill("8");
    await misfit.waitFor({ state: "detached" });
    await settledTokens(page);
    await expect(sheet.getByText("does not fit in accelerator memory").count()).resolves.toBe(0);
    await expect.poll(() => sheet.getByTestId("fit-cell").allTextContents()).toEqual(["fits", "fits"]);
    await page.getByRole("button", { name: "Save draft" }).click();
    // The editor starts again from the saved version (it is keyed by version).
    await page.getByText("Editing version 2 of revision 1").waitFor();

    // The server computed and stored the figures from what the sheet saved.
    const saved = (await api.get(`/api/plans/${created.id}/revisions/1`).expect(200)).body;
    const acc = (await api.get("/api/accelerators").expect(200)).body.accelerators.find(
      (a: any) => a.name === acceleratorName,
    );
    expect(saved.content.budget.inputs).toEqual({
      cluster: { acceleratorId: acc.id },
      accelerators: 32,
      contextParallel: 2,
      lossChunks: 8,
      vocabSize: 128256,
    });
    expect(saved.content.budget.budgetModel).toBe(2);
    expect(saved.content.budget.cluster).toMatchObject({ name: acceleratorName, memoryBytes: 48 * GIB });
    expect(saved.content.budget.estimate.totals.tokens).toBe(100 * 64 * 65536 + 100 * 32 * 131072);
    expect(saved.content.budget.estimate.stages.map((x: any) => x.fits)).toEqual([true, true]);
    expect(saved.content.budget.estimate.stages[1].trainingMemory.logits).toBe(67_243_081_728 / 2 / 8);

    // Someone saves in between (another tab): this page's version is stale, and it says so.
    await put(api, `/api/plans/${created.id}/revisions/1`, { version: 2, notes: "edited elsewhere" }).expect(200);
    await sheet.getByLabel("Stage 1 steps", { exact: true }).fill("120");
    await page.getByRole("button", { name: "Save draft" }).click();
    await page.getByText("Changed since you read it — reload").waitFor();
    await page.getByRole("button", { name: "Reload the saved draft" }).click();
    await page.getByText("Editing version 3 of revision 1").waitFor();
    // The reloaded sheet starts from the stored budget block (its fields are filled once the saved draft is read).
    const reloaded = page.getByRole("region", { name: "Budget sheet" });
    await expect.poll(() => reloaded.getByLabel("Context parallelism", { exact: true }).inputValue()).toBe("2");
    await expect.poll(() => reloaded.getByLabel("Stage 1 steps", { exact: true }).inputValue()).toBe("100");
    await settledTokens(page);
    await screenshot(page, "plan-budget");

    expect(errors).toEqual([]);
    await page.context().close();
  }, 90_000);

  it("an accelerator retired under a plan: a new draft names it and asks for another; an estimator link still loads with a notice", async () => {
    const acceleratorName = await catalogEntry("Retired-bed");
    const acc = (await api.get("/api/accelerators").expect(200)).body.accelerators.find(
      (a: { name: string }) => a.name === acceleratorName,
    );
    const created = await createPlan(api, profile.id);
    const base = `/api/plans/${created.id}/revisions/1`;
    await put(api, base, { version: 1, budget: { cluster: { acceleratorId: acc.id }, accelerators: 64 } }).expect(200);
    await post(api, `${base}/submit`).expect(200);
    // An approver sends it back, so the owner may start revision 2 (the hash goes along when the contract asks for it).
    const approver = await makeTestApp().agentAs(["approver"]);
    const hash = (await api.get(base).expect(200)).body.contentHash;
    let sent = await post(approver, `${base}/decisions`, { decision: "request_changes", comment: "cheaper hardware" });
    if (sent.status === 400 && sent.body.error?.fields?.contentHash)
      sent = await post(approver, `${base}/decisions`, {
        decision: "request_changes",
        comment: "cheaper hardware",
        contentHash: hash,
      });
    expect(sent.status).toBe(200);
    // Deleting it retires it: the plan was costed on it.
    const del = await api.delete(`/api/accelerators/${acc.id}`).set("X-CSRF-Token", api.csrf);
    expect(del.status).toBe(200);

    const other = await catalogEntry("Live-bed");

    const page = await signedIn(planner, `/plans/${created.id}`);
    await page.getByRole("button", { name: "Start new revision" }).click();
    await page.waitForURL(new RegExp(`/plans/${created.id}/revisions/2/edit`));
    const sheet = page.getByRole("region", { name: "Budget sheet" });
    const notice = sheet.getByTestId("retired-accelerator");
    await expect.poll(() => notice.textContent()).toContain(`${acceleratorName} is retired`);
    await expect
      .poll(() => sheet.getByLabel("Catalog accelerator").locator("option:checked").textContent())
      .toBe(`${acceleratorName} (retired)`);
    await settledTokens(page);
    await screenshot(page, "plan-budget-retired-accelerator");
    // Once another is picked, the retired one leaves the picker.
    await sheet.getByLabel("Catalog accelerator").selectOption({ label: other });
    await notice.waitFor({ state: "detached" });
    await expect
      .poll(() => sheet.getByLabel("Catalog accelerator").locator("option").allTextContents())
      .not.toContain(`${acceleratorName} (retired)`);

    // An estimator link to the retired accelerator still loads its figures, with the notice.
    await page.goto(`${server.url}/estimator?model=${profile.id}&acc=${acc.id}`);
    await expect.poll(() => page.getByTestId("retired-accelerator").textContent()).toContain(acceleratorName);
    await expect(settledTokens(page)).resolves.toBeTruthy();
    expect(errors).toEqual([]);
    await page.context().close();
  }, 90_000);

  it("a new plan is costed before its first save; the plan page shows the stored figures", async () => {
    const acceleratorName = await catalogEntry("New-bed");
    const page = await signedIn(planner, "/plans/new");
    const form = page.getByRole("form", { name: "New plan" });
    await form.getByLabel("Title").fill("Costed from the start");
    // The picker offers one page of profiles; its search finds this one wherever it sorts.
    await page.getByLabel("Find a model profile").fill(profile.name);
    await form.getByLabel("Model", { exact: true }).selectOption({ label: profile.name });
    const sheet = page.getByRole("region", { name: "Budget sheet" });
    await sheet.getByText("Add a stage to cost this plan").waitFor();
    await form.getByRole("button", { name: "Add stage" }).click();
    await sheet.getByLabel("Catalog accelerator").selectOption({ label: acceleratorName });
    // The editor's new stage: 400 steps × 64 sequences × 32768 tokens = 838 860 800.
    await expect(settledTokens(page)).resolves.toBe("839 million");
    await form.getByRole("button", { name: "Save draft" }).click();
    await page.waitForURL(/\/plans\/\d+$/);
    const id = Number(new URL(page.url()).pathname.split("/").pop());
    await page.getByTestId("budget-panel").waitFor();
    await expect.poll(() => page.getByTestId("budget-panel").textContent()).toContain(acceleratorName);
    // The frozen figures carry the currency they were costed in and state each convention once.
    await expect(page.getByTestId("budget-panel").textContent()).resolves.toMatch(/Cost \([A-Z]{3}\)/);
    await expect.poll(() => page.locator("#frozen-convention-activations").count()).toBe(1);
    const rev = (await api.get(`/api/plans/${id}/revisions/1`).expect(200)).body;
    expect(rev.content.budget.inputs).toMatchObject({ accelerators: 8 });
    expect(rev.content.budget.cluster.name).toBe(acceleratorName);
    expect(rev.content.budget.estimate.totals.tokens).toBe(400 * 64 * 32768);
    expect(errors).toEqual([]);
    await page.context().close();
  }, 60_000);

  it("a viewer reads the catalog but gets no way to change it", async () => {
    const viewer = await createTestUser(["viewer"], "Vi Viewer");
    const page = await signedIn(viewer, "/accelerators");
    await page.getByRole("table", { name: "Accelerators" }).waitFor();
    // The line for readers says the page has drawn for this role: only then does the absence of controls mean anything.
    await page.getByText("Infra leads and admins keep this list.").waitFor();
    await expect(page.getByRole("form").count()).resolves.toBe(0);
    await expect(page.getByRole("button", { name: /^(Edit|Delete) / }).count()).resolves.toBe(0);
    // The workspace currency is shown, not offered for change (admins change it).
    await expect
      .poll(() => page.getByTestId("workspace-currency").textContent())
      .toMatch(/in [A-Z]{3}, the workspace currency/);
    expect(errors).toEqual([]);
    await page.context().close();
  });
});
