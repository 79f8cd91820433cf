import fs from "node:fs";
import path from "node:path";
import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import {
  launchBrowser,
  screenshot,
  SCREENSHOT_DIR,
  requireBuiltClient,
  signIn,
  downloadedText,
} from "../setup/browser";
import { startTestServer } from "../setup/server";
import { createTestUser, type TestUser } from "../setup/users";
import { makeTestApp } from "../setup/app";
import { createPlan, createProfile } from "../setup/plans";
import { activeBoundSearches } from "../../server/features/bounds/bounds.service";
import { METHOD_CATALOG } from "../../shared/methods";
import { readPairCsvHeader } from "../../client/src/features/workbench/state/csv-header";
import { expandAnalysis } from "../../shared/analysis-columns";
import { analysisColumnsResponseSchema } from "../../shared/schemas/analysis-columns";
import { DEFAULT_GRID } from "../../shared/schemas/bounds";

const fixturePath = path.resolve(import.meta.dirname, "../fixtures/configs/every-warning.json");

let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Browser;
let researcher: TestUser;

beforeAll(async () => {
  requireBuiltClient();
  [server, browser, researcher] = await Promise.all([
    startTestServer(),
    launchBrowser(),
    createTestUser(["researcher"], "Wren Workbench"),
  ]);
});

afterAll(async () => {
  await browser?.close();
  await server?.close();
});

/** The analysis the page asked for last, once it has answered with the given target. */
const analysisFor = (page: Page, target: number) =>
  page.waitForResponse(
    (r) =>
      r.url().endsWith("/api/analyses") &&
      r.request().method() === "POST" &&
      JSON.parse(r.request().postData() ?? "{}").targetContext === target,
  );

/** Inputs a person sets on the workbench, read back from the screen. */
async function readInputs(page: Page) {
  return {
    model: await page.getByLabel("Model", { exact: true }).inputValue(),
    target: await page.getByLabel("Target length L′ (tokens)").inputValue(),
    method1: await page.getByLabel("Method 1", { exact: true }).inputValue(),
    method2: await page.getByLabel("Method 2", { exact: true }).inputValue(),
    shown: await page.getByLabel("Method shown").first().inputValue(),
    flaggedOnly: await page.getByLabel("Flagged pairs only").isChecked(),
  };
}

describe("workbench in a browser", () => {
  it("imports a troubled config, saves it, compares two methods, filters and downloads the pairs, and reproduces the view from its URL", async () => {
    const context = await browser.newContext({ viewport: { width: 1360, height: 900 }, acceptDownloads: true });
    const page = await context.newPage();
    const pageErrors: string[] = [];
    page.on("pageerror", (e) => pageErrors.push(e.message));
    page.on("console", (m) => {
      if (m.type() === "error" && !m.text().startsWith("Failed to load resource")) pageErrors.push(m.text());
    });

    await page.goto(`${server.url}/models/import`);
    await page.waitForURL(/\/sign-in/);
    await signIn(page, researcher);
    await page.getByRole("heading", { level: 1, name: "Import a config.json" }).waitFor();
    expect(await page.getByRole("navigation", { name: "Main" }).getByRole("link").allTextContents()).toEqual(
      expect.arrayContaining(["Profiles", "Workbench"]),
    );

    // Upload: the preview is parse-only; every warning the server raised is on screen with its fix.
    const previewed = page.waitForResponse(
      (r) => r.url().includes("/api/models/import") && !r.url().includes("save=true"),
    );
    await page.getByLabel("config.json to import").setInputFiles(fixturePath);
    const preview = await (await previewed).json();
    expect(preview.saved).toBeNull();
    const warningsBox = page.getByTestId("import-warnings");
    await warningsBox.waitFor();
    const items = warningsBox.locator("li");
    await expect.poll(() => items.count()).toBe(preview.warnings.length);
    for (const w of preview.warnings) {
      const item = warningsBox.locator(`li[data-code="${w.code}"]`).first();
      await expect.poll(() => item.textContent()).toContain(w.message);
      await expect.poll(() => item.textContent()).toContain(w.fix);
    }
    // The fixture carries each mistake of the domain notes' import list that applies to a yarn block.
    const codes = preview.warnings.map((w: { code: string }) => w.code);
    for (const code of [
      "missing_original_length",
      "head_dim_differs",
      "partial_rotation",
      "unknown_scaling_key",
      "attention_factor_twice",
    ]) {
      expect(codes).toContain(code);
    }
    // d = head_dim 256 × partial_rotary_factor 0.5 = 128, shown before saving.
    await expect.poll(() => page.getByTestId("rotary-summary").textContent()).toContain("d = 128");
    await screenshot(page, "workbench-import-preview");

    const name = `Troubled ${Date.now().toString(36)}`;
    const form = page.getByRole("form", { name: "Imported profile" });
    await form.getByLabel("Name", { exact: true }).fill(name);
    const saving = page.waitForResponse((r) => r.url().includes("/api/models/import?save=true"));
    await form.getByRole("button", { name: "Save profile" }).click();
    const saved = await saving;
    expect(saved.status()).toBe(201);
    const savedModel = (await saved.json()).saved;
    // The edit is saved on top of what the file said; the rest is as previewed, and the warnings are kept.
    expect(savedModel).toMatchObject({
      name,
      trainedContext: preview.profile.trainedContext,
      headDim: 256,
      rotaryDim: 128,
      sourceFileName: "every-warning.json",
    });
    expect(savedModel.importWarnings).toEqual(preview.warnings);
    await page.waitForURL(`${server.url}/models/${savedModel.id}`);
    await page.getByRole("heading", { level: 1, name }).waitFor();
    await expect.poll(() => page.getByTestId("import-warnings").locator("li").count()).toBe(preview.warnings.length);
    const sourceLink = page.getByRole("link", { name: /Download the original/ });
    const source = await page.request.get(new URL((await sourceLink.getAttribute("href"))!, server.url).toString());
    expect(await source.text()).toBe(fs.readFileSync(fixturePath, "utf8"));
    await screenshot(page, "workbench-profile");

    // Workbench with the saved profile: linear against NTK-aware at 8× the trained length.
    const L = savedModel.trainedContext as number;
    const target = 8 * L;
    await page.getByRole("link", { name: "Open in the workbench" }).click();
    await page.waitForURL(/\/workbench\?/);
    await page.getByLabel("Method 1", { exact: true }).waitFor();
    // A select reads "" until its options (the profiles) have loaded and hold the chosen one.
    await expect.poll(() => page.getByLabel("Model", { exact: true }).inputValue()).toBe(String(savedModel.id));
    const answered = analysisFor(page, target);
    await page.getByLabel("Method 2", { exact: true }).selectOption("ntk");
    await page.getByLabel("Target length L′ (tokens)").fill(String(target));
    // The page asks for the column form; expanded, it is the row form the API documents.
    const analysis = expandAnalysis(analysisColumnsResponseSchema.parse(await (await answered).json()));
    expect(analysis.methods.map((m: { method: string }) => m.method)).toEqual(["linear", "ntk"]);
    await page.getByTestId("analysis-status").getByText(`L′ = ${target}`).waitFor();

    // Flags on the chart, one marker per flagged pair and flag.
    const chart = page.getByTestId("spectrum-chart");
    const markers = (flag: string) => chart.locator(`[data-testid="flag-marker"][data-flag="${flag}"]`);
    const [linear, ntk] = analysis.methods;
    // λ_i = 2π·b^(2i/d) > L, counted straight from the definition (RoFormer, Su et al. 2021), not from the engine.
    const d = 128,
      b = 10_000;
    const beyond = Array.from({ length: d / 2 }, (_v, i) => 2 * Math.PI * b ** ((2 * i) / d)).filter(
      (lambda) => lambda > L,
    ).length;
    expect(beyond).toBeGreaterThan(0);
    // The chart draws the answer once its frame has a width (visx ParentSize), after the status line above.
    await expect.poll(() => markers("exceedsTrainedWindow").count()).toBe(beyond);
    await expect.poll(() => markers("compressedResolution").count()).toBe(linear.summary.compressedResolutionPairs);
    expect(linear.summary.compressedResolutionPairs).toBeGreaterThan(0);
    // Position interpolation never reaches unseen angles (Chen et al. 2023; DOMAIN flag rule). Read once the chart
    // shows the linear row's markers above, so a zero here is the drawn chart's, not an empty frame's.
    await expect(markers("unseenAngles").count()).resolves.toBe(0);

    await page.getByLabel("Method shown").first().selectOption("1");
    await expect.poll(() => markers("unseenAngles").count()).toBe(ntk.summary.unseenAnglesPairs);
    // NTK-aware scaling extrapolates some low-frequency pairs (Peng et al. 2023 §3.1).
    expect(ntk.summary.unseenAnglesPairs).toBeGreaterThan(0);
    const hover = chart.getByTestId("chart-hover");
    const box = (await hover.boundingBox())!;
    await hover.hover({ position: { x: box.width * 0.995, y: box.height / 2 } });
    await expect.poll(() => page.getByTestId("chart-tooltip").textContent()).toMatch(new RegExp(`Pair ${d / 2 - 1} `));
    await page
      .getByTestId("smallest-base")
      .getByText(/Smallest base that supports|No base on the grid/)
      .waitFor({ timeout: 20_000 });
    await page.getByTestId("supported-lengths").getByText("scanning…").waitFor({ state: "detached", timeout: 20_000 });
    await page.mouse.move(0, 0);
    // Each figure's explanation is one click away, with its published source and the caution.
    const spectrumPanel = page
      .getByRole("heading", { name: "Wavelength per pair" })
      .locator("xpath=ancestor::section[1]");
    await spectrumPanel.getByText("How is this computed?").click();
    const explained = spectrumPanel.locator("details[open]");
    await expect.poll(() => explained.textContent()).toContain("RoFormer, Su et al. 2021");
    await expect
      .poll(() => explained.textContent())
      .toContain("confirmed only by long-context evaluations of the tuned model");
    await screenshot(page, "workbench-charts");

    // The table: all 64 pairs, then only flagged ones; the CSV holds exactly the rows and columns shown.
    const table = page.getByRole("table", { name: /^Pairs of/ });
    const rows = table.locator("tbody tr");
    await expect.poll(() => rows.count()).toBe(d / 2);
    await page.getByLabel("Flagged pairs only").check();
    const flagged = ntk.pairs.filter((p) => p.exceedsTrainedWindow || p.unseenAngles || p.compressedResolution).length;
    expect(flagged).toBeLessThan(d / 2);
    await page
      .getByTestId("pair-count")
      .getByText(`${flagged} of ${d / 2} pairs shown`)
      .waitFor();
    await expect(rows.count()).resolves.toBe(flagged);

    const [download] = await Promise.all([
      page.waitForEvent("download"),
      page.getByRole("button", { name: "Download CSV" }).click(),
    ]);
    const text = await downloadedText(download);
    // Before the table, # lines name what produced it; they parse back to the analysis shown.
    expect(readPairCsvHeader(text)).toEqual({
      model: {
        rotaryDim: analysis.model.rotaryDim,
        headDim: analysis.model.headDim,
        ropeTheta: analysis.model.ropeTheta,
        trainedContext: analysis.model.trainedContext,
        partialRotaryFactor: analysis.model.partialRotaryFactor,
      },
      profile: name,
      method: "ntk",
      "method name": METHOD_CATALOG.ntk.label,
      parameters: ntk.params,
      "target length": target,
      bands: analysis.bands,
      "engine version": analysis.engineVersion,
      rows: "flagged pairs only",
    });
    const csv = Papa.parse<string[]>(text.trim(), { comments: "#" });
    const headers = (await table.locator("thead th").allTextContents()).map((t) => t.replace(/[▲▼↕]/g, "").trim());
    expect(csv.data[0]).toEqual(headers);
    expect(csv.data.length - 1).toBe(await rows.count());
    const firstShown = (await rows.first().locator("td").first().textContent())!.trim();
    expect(csv.data[1][0]).toBe(firstShown);
    // The table's own panel, at reading size (the full page is in workbench-charts).
    await page
      .getByRole("heading", { name: "Pair by pair" })
      .locator("xpath=ancestor::section[1]")
      .screenshot({ path: path.join(SCREENSHOT_DIR, "workbench-table.png") });

    // The URL alone reproduces the view.
    const before = await readInputs(page);
    expect(before).toMatchObject({
      target: String(target),
      method1: "linear",
      method2: "ntk",
      shown: "1",
      flaggedOnly: true,
    });
    const url = page.url();
    const reloaded = analysisFor(page, target);
    await page.reload();
    await reloaded;
    await page.getByLabel("Method 2", { exact: true }).waitFor();
    // The model picker and the chart's picker fill in as their data arrives after the reload.
    await expect.poll(() => readInputs(page)).toEqual(before);
    expect(page.url()).toBe(url);
    await expect.poll(() => rows.count()).toBe(flagged);

    expect(pageErrors).toEqual([]);
    await context.close();
  }, 90_000);
});

/** Polls a condition the page cannot show (server state), a short step at a time. */
async function eventually(check: () => boolean, ms = 10_000) {
  const end = Date.now() + ms;
  while (!check()) {
    if (Date.now() > end) throw new Error("condition not met in time");
    await new Promise((r) => setTimeout(r, 50));
  }
}

describe("profiles and bounds in a browser", () => {
  it("a profile that a plan uses is retired, not deleted, naming the plan, and can be restored; a viewer sees no edit controls", async () => {
    const { agentAs } = makeTestApp();
    const author = await agentAs(["researcher"]);
    const profile = await createProfile(author);
    const plan = await createPlan(author, profile.id);
    const viewer = await createTestUser(["viewer"], "Vale Reader");

    const context = await browser.newContext({ viewport: { width: 1280, height: 860 } });
    const page = await context.newPage();
    await page.goto(`${server.url}/models/${profile.id}`);
    await signIn(page, researcher);
    await page.getByRole("heading", { level: 1, name: profile.name }).waitFor();
    await page.getByRole("button", { name: "Delete profile" }).click();
    const retired = page.waitForResponse(
      (r) => r.url().endsWith(`/api/models/${profile.id}`) && r.request().method() === "DELETE",
    );
    await page.getByRole("button", { name: "Yes, delete it" }).click();
    expect((await retired).status()).toBe(200);
    const notice = page.getByRole("status").filter({ hasText: "Retired, not deleted" });
    await expect.poll(() => notice.textContent()).toContain(`#${plan.id}`);
    expect(new URL(page.url()).pathname).toBe(`/models/${profile.id}`);
    await page.getByText("This profile is retired").waitFor();
    await screenshot(page, "workbench-profile-in-use");
    // Gone from the new-plan picker; the list marks it retired.
    await page.goto(`${server.url}/plans/new`);
    await page.getByLabel("Model", { exact: true }).waitFor();
    await expect
      .poll(() => page.getByLabel("Model", { exact: true }).locator("option").allTextContents())
      .not.toContain(profile.name);
    await page.goto(`${server.url}/models/${profile.id}`);
    await page.getByRole("button", { name: "Restore profile" }).click();
    await page.getByRole("button", { name: "Delete profile" }).waitFor();
    await page.getByRole("button", { name: "Sign out" }).click();
    await page.waitForURL(/\/sign-in/);

    await page.goto(`${server.url}/models`);
    await signIn(page, viewer);
    await page.getByRole("heading", { level: 1, name: "Model profiles" }).waitFor();
    const table = page.getByRole("table", { name: "Model profiles" });
    await page.getByLabel("Find a profile").fill(profile.name);
    await table.getByRole("link", { name: profile.name }).waitFor();
    await expect(page.getByRole("link", { name: "Import config.json" }).count()).resolves.toBe(0);
    await table.getByRole("link", { name: profile.name }).click();
    await page.getByTestId("profile-facts").waitFor();
    await expect(page.getByRole("button", { name: "Delete profile" }).count()).resolves.toBe(0);
    await expect(page.getByRole("form", { name: "Edit profile" }).count()).resolves.toBe(0);
    await context.close();
  }, 60_000);

  it("a config with 30 heads over hidden_size 4096 previews with warnings and saves once head_dim is given", async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    const pageErrors: string[] = [];
    page.on("pageerror", (e) => pageErrors.push(e.message));
    await page.goto(`${server.url}/models/import`);
    await signIn(page, researcher);
    await page.getByRole("heading", { level: 1, name: "Import a config.json" }).waitFor();
    await page
      .getByLabel("config.json to import")
      .setInputFiles(path.resolve(import.meta.dirname, "../fixtures/configs/thirty-heads.json"));
    const warningsBox = page.getByTestId("import-warnings");
    await warningsBox.waitFor();
    // Before the fix the page said "the server sent a response this page does not understand" here.
    expect(await page.getByText("does not understand").count()).toBe(0);
    await expect
      .poll(() => warningsBox.locator('li[data-code="head_dim_not_integer"]').textContent())
      .toContain("136.53");
    await expect
      .poll(() => warningsBox.locator('li[data-code="kv_heads_not_divisor"]').textContent())
      .toContain("1, 2, 3, 5, 6, 10, 15 or 30");
    const form = page.getByRole("form", { name: "Imported profile" });
    expect(await form.getByLabel("Head dimension (head_dim)").inputValue()).toBe("");
    await screenshot(page, "workbench-import-odd-heads");

    // Save is held until head_dim is given and the key/value heads divide the query heads; nothing is sent before.
    let posted = 0;
    page.on("request", (r) => {
      if (r.url().includes("save=true")) posted += 1;
    });
    await form.getByRole("button", { name: "Save profile" }).click();
    await expect.poll(() => form.getByText("required").count()).toBeGreaterThan(0);
    await form.getByLabel("Name", { exact: true }).fill(`Odd heads ${Date.now().toString(36)}`);
    await form.getByLabel("Head dimension (head_dim)").fill("128");
    await form.getByRole("button", { name: "Save profile" }).click();
    await expect.poll(() => form.getByText("Attention heads must be a multiple of key/value heads.").count()).toBe(1);
    expect(posted).toBe(0);
    await form.getByLabel("KV heads (num_key_value_heads)").fill("6");
    const saving = page.waitForResponse((r) => r.url().includes("/api/models/import?save=true"));
    await form.getByRole("button", { name: "Save profile" }).click();
    const saved = await saving;
    expect(saved.status()).toBe(201);
    expect((await saved.json()).saved).toMatchObject({ headDim: 128, kvHeads: 6, attentionHeads: 30 });
    expect(pageErrors).toEqual([]);
    await context.close();
  }, 60_000);

  it("cancelling the smallest-base search stops the server's search", async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 860 } });
    const page = await context.newPage();
    // A typed-in shape and a target of 2^30 tokens, which no base on the grid supports. The default grid's 701 bases
    // are all tried in about 1.5 s, sooner than a slow browser reaches Cancel (with E2E_CPU_SLOWDOWN=6 the search
    // finished first and Cancel was gone): the page's question is sent on the finest grid the API takes (1000 bases per
    // decade, 7001 bases, shared/schemas/bounds.ts), so the server's search outlasts the click.
    await page.route("**/api/bounds/base/stream", (route) =>
      route.continue({
        postData: JSON.stringify({ ...route.request().postDataJSON(), grid: { ...DEFAULT_GRID, perDecade: 1000 } }),
      }),
    );
    const methods = encodeURIComponent(JSON.stringify([["linear", {}]]));
    await page.goto(`${server.url}/workbench?shape=128,10000,4096,1&target=${2 ** 30}&methods=${methods}`);
    await signIn(page, researcher);
    await page.getByLabel("Head dimension").waitFor();
    expect(await page.getByLabel("Model", { exact: true }).inputValue()).toBe("shape");
    const search = page.getByTestId("smallest-base");
    await search.getByText(/bases tried/).waitFor({ timeout: 20_000 });
    await eventually(() => activeBoundSearches() > 0);
    await search.getByRole("button", { name: "Cancel" }).click();
    await search.getByText("Search cancelled").waitFor();
    await eventually(() => activeBoundSearches() === 0);
    await search.getByRole("button", { name: "Search again" }).waitFor();
    await context.close();
  }, 60_000);
});
