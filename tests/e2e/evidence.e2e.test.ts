import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import type { Locator } from "playwright-core";
import { SCREENSHOT_DIR, downloadedText, launchBrowser, requireBuiltClient, screenshot } from "../setup/browser";
import { makeTestApp } from "../setup/app";
import { createPlan, createProfile, decide, post } from "../setup/plans";
import { criterion, fullProvenance, upload } from "../setup/evidence";
import { signedInPages } from "../setup/signed-in";
import { startTestServer } from "../setup/server";
import { createTestUser, type TestUser } from "../setup/users";

// An approved plan → passkey results uploaded in the browser → heatmap → proof by an approver → plans list by proof.
let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Browser;
let researcher: TestUser;
let approver: TestUser;
let planId = 0;
let title = "";
let contentHash = "";
let chartsPlanId = 0;
const { signedIn, closeAll, errors } = signedInPages(
  () => browser,
  () => server.url,
  { width: 1280 },
);

// Passkey accuracy at 32768 worked by hand: Σ correct ÷ Σ trials = (10 + 9 + 19) / (10 + 10 + 20) = 38 / 40 = 0.95 ≥ 0.9.
const PASSKEY_CSV = [
  "context_length,depth,trials,correct",
  "4096,0,10,10",
  "4096,0.5,10,10",
  "4096,1,10,10",
  "16384,0,10,10",
  "16384,0.5,10,10",
  "16384,1,10,9",
  "32768,0,10,10",
  "32768,0.5,10,9",
  "32768,1,20,19",
].join("\n");

beforeAll(async () => {
  requireBuiltClient();
  [server, browser, researcher, approver] = await Promise.all([
    startTestServer(),
    launchBrowser(),
    createTestUser(["researcher"], "Rowan Layer"),
    createTestUser(["approver"], "Ada Proofer"),
  ]);
  const test = makeTestApp();
  const [r, a] = await Promise.all([test.signIn(researcher), test.signIn(approver)]);
  const profile = await createProfile(r);
  title = `Proof run ${Math.random().toString(36).slice(2, 7)}`;
  const revision = {
    targetContext: 32768,
    method: { method: "yarn", factor: 8 },
    stages: [],
    acceptance: [criterion("passkey", 32768, ">=", 0.9)],
    notes: "",
  };
  planId = (await createPlan(r, profile.id, { title, revision })).id;
  await post(r, `/api/plans/${planId}/revisions/1/submit`).expect(200);
  await decide(a, `/api/plans/${planId}/revisions/1/decisions`, { decision: "approve" }).expect(200);
  contentHash = (await r.get(`/api/plans/${planId}/revisions/1`).expect(200)).body.contentHash as string;

  // A second approved plan holding one upload of every other kind, for the other four charts.
  const charts = { targetContext: 32768, method: { method: "yarn", factor: 8 }, stages: [], notes: "" };
  chartsPlanId = (
    await createPlan(r, profile.id, {
      revision: {
        ...charts,
        acceptance: [
          criterion("needle", 32768, ">=", 0.5, { aggregate: "mean" }),
          criterion("ruler", 32768, ">=", 0.75),
          criterion("perplexity", 32768, "<=", 1.1, { measure: "ratio" }),
          criterion("short_regression", 4096, "<=", 0.02),
        ],
      },
    })
  ).id;
  await post(r, `/api/plans/${chartsPlanId}/revisions/1/submit`).expect(200);
  await decide(a, `/api/plans/${chartsPlanId}/revisions/1/decisions`, { decision: "approve" }).expect(200);
  const fingerprint = (await r.get(`/api/plans/${chartsPlanId}/revisions/1`).expect(200)).body.rotaryFingerprint;
  const files: Record<string, string[]> = {
    needle: ["context_length,depth,trials,correct", "4096,0,10,10", "4096,1,10,9", "32768,0,10,8", "32768,1,10,6"],
    ruler: ["context_length,task,score", "4096,niah,0.95", "4096,vt,0.85", "32768,niah,0.8", "32768,vt,0.6"],
    perplexity: ["context_length,perplexity", "4096,8.0", "16384,8.2", "32768,8.4"],
    short_regression: ["benchmark,baseline,tuned", "mmlu,0.62,0.61", "hellaswag,0.80,0.785"],
  };
  for (const [kind, lines] of Object.entries(files))
    await upload(r, chartsPlanId, { kind, fingerprint, file: lines.join("\n") }).expect(201);
});

afterAll(async () => {
  await closeAll();
  await browser?.close();
  await server?.close();
});

/**
 * The evidence section alone (the plan page above it runs past the full-page picture's 4000 px). The viewport is first
 * made as tall as the section, so the capture does not resize the page under the charts, and the picture waits until
 * every chart has re-measured its figure (ParentSize) at that size.
 */
async function sectionShot(page: Page, section: Locator, name: string) {
  fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const width = page.viewportSize()!.width;
  const box = (await section.boundingBox())!;
  await page.setViewportSize({ width, height: Math.min(4000, Math.ceil(box.height) + 40) });
  await page.waitForFunction(() =>
    [...document.querySelectorAll("figure[data-testid]")].every((f) => {
      const svg = f.querySelector("svg[role=img]");
      return !svg || svg.getBoundingClientRect().width > f.getBoundingClientRect().width * 0.9;
    }),
  );
  await section.screenshot({ path: path.join(SCREENSHOT_DIR, `${name}.png`), animations: "disabled" });
  await page.setViewportSize({ width, height: 900 });
}

const csvFile = (text: string) => ({ name: "passkey.csv", mimeType: "text/csv", buffer: Buffer.from(text) });

describe("evidence and proof in the browser", () => {
  it("a researcher on the plan uploads passkey results; a bad file is named by row and column; the heatmap draws", async () => {
    const page = await signedIn(researcher, `/plans/${planId}`);
    const section = page.getByTestId("evidence-section");
    await section.waitFor({ timeout: 20_000 });
    const form = section.getByRole("form", { name: "Upload evaluation results" });
    // the fingerprint is prefilled with the revision's own
    expect(await form.getByLabel("Rotary fingerprint of the model that was run").inputValue()).toBe(
      await page.getByTestId("revision-fingerprint").textContent(),
    );
    await form.getByLabel("Provenance (JSON)").fill(JSON.stringify(fullProvenance(), null, 2));

    await form.getByLabel("Results file").setInputFiles(csvFile("context_length,depth,trials,correct\n32768,0,ten,10"));
    await form.getByRole("button", { name: "Upload results" }).click();
    await form.getByTestId("upload-problems").getByText('Row 2, column trials: "ten" is not a number.').waitFor();
    // The section waited for above is drawn before its list of uploads has loaded: wait for the list's empty line.
    await section.getByText("No evaluation results uploaded yet.").waitFor();
    expect(await section.getByText("No evaluation results uploaded yet.").count()).toBe(1);

    await form.getByLabel("Results file").setInputFiles(csvFile(PASSKEY_CSV));
    await form.getByRole("button", { name: "Upload results" }).click();
    await form.getByText(/^Stored passkey\.csv as evidence #\d+: 9 rows/).waitFor();

    const heatmap = section.getByTestId("heatmap-passkey");
    // the figure is in the page before visx ParentSize has measured it (debounced 50 ms); its svg comes once it has a width
    await heatmap.locator("svg[role=img]").waitFor({ timeout: 20_000 });
    expect(await heatmap.locator("rect[data-cell]").count()).toBe(9);
    // the chart takes its figure's width (visx ParentSize), whatever the panel's width is
    const [figure, drawn] = await Promise.all([heatmap.boundingBox(), heatmap.locator("svg").first().boundingBox()]);
    expect(drawn!.width, JSON.stringify({ figure, drawn })).toBeGreaterThan(figure!.width * 0.9);
    expect(await heatmap.locator('[data-marker="trained"]').count()).toBe(1);
    expect(await heatmap.locator('[data-marker="target"]').count()).toBe(1);
    const verdict = section.locator('[data-criterion="0"]');
    expect(await verdict.getAttribute("data-status")).toBe("pass");
    expect(await verdict.getByTestId("observed").textContent()).toBe("0.950 (95.0 %), must be ≥ 0.900 (90.0 %)");
    const checksum = await section.getByTestId("evidence-checksum").textContent();
    expect(checksum).toBe(crypto.createHash("sha256").update(PASSKEY_CSV).digest("hex"));
    // the file comes back from PostgreSQL byte for byte
    const [download] = await Promise.all([
      page.waitForEvent("download"),
      section.getByRole("link", { name: "passkey.csv" }).click(),
    ]);
    expect(download.suggestedFilename()).toBe("passkey.csv");
    expect(await downloadedText(download)).toBe(PASSKEY_CSV);
    await sectionShot(page, section, "evidence-heatmap");
  }, 90_000);

  it("on a 390 px screen the heatmap fits the width", async () => {
    const page = await signedIn(researcher, `/plans/${planId}`, 390);
    const heatmap = page.getByTestId("heatmap-passkey");
    await heatmap.locator("svg[role=img]").waitFor({ timeout: 20_000 });
    const svg = (await heatmap.locator("svg[role=img]").boundingBox())!;
    expect(svg.x).toBeGreaterThanOrEqual(0);
    expect(svg.x + svg.width).toBeLessThanOrEqual(390);
    await sectionShot(page, page.getByTestId("evidence-section"), "evidence-heatmap-390");
  }, 60_000);

  it("every kind's chart draws inside a 390 px screen", async () => {
    const page = await signedIn(researcher, `/plans/${chartsPlanId}`, 390);
    const section = page.getByTestId("evidence-section");
    for (const id of ["heatmap-needle", "chart-tasks", "chart-perplexity", "chart-regression"]) {
      const svg = section.getByTestId(id).locator("svg[role=img]");
      await svg.waitFor({ timeout: 20_000 });
      const box = (await svg.boundingBox())!;
      expect(box.x, id).toBeGreaterThanOrEqual(0);
      expect(box.x + box.width, id).toBeLessThanOrEqual(390);
    }
    // the task chart marks the effective length the verdict reports (mean 0.9 at 4k, 0.7 at 32k, bar 0.75 → 4k)
    expect(await section.getByTestId("chart-tasks").locator('[data-marker="effective"]').count()).toBe(1);
    expect(await section.getByTestId("chart-regression").locator("[data-benchmark]").count()).toBe(2);
    await sectionShot(page, section, "evidence-charts-390");
  }, 60_000);

  it("an approver proves the revision, signing the hash and evidence shown; the plans list filters by proof", async () => {
    const page = await signedIn(approver, `/plans/${planId}`);
    const section = page.getByTestId("evidence-section");
    await section.waitFor({ timeout: 20_000 });
    await section.getByRole("button", { name: "Mark proven" }).click();
    const dialog = page.getByRole("dialog");
    expect(await dialog.getByTestId("proof-hash-to-sign").textContent()).toBe(contentHash);
    expect(await dialog.getByTestId("proof-evidence-to-sign").textContent()).toMatch(/^#\d+$/);
    await sectionShot(page, dialog, "evidence-proof-dialog");
    await dialog.getByRole("button", { name: "Sign as proven" }).click();
    await page.getByText("Revision 1 is proven and the decision is signed.").waitFor();
    const record = section.getByTestId("proof-record");
    await record.locator('[data-proof="proven"]').waitFor();
    expect(await record.getByTestId("proof-signature").getAttribute("data-signature")).toBe("valid");
    await sectionShot(page, section, "evidence-proven");

    await page.goto(`${server.url}/plans`);
    await page.getByLabel("Proof").selectOption("proven");
    await page.waitForURL((u) => u.searchParams.get("proof") === "proven");
    const row = page.getByRole("row", { name: new RegExp(title) });
    await row.waitFor();
    expect(await row.locator('[data-proof="proven"]').count()).toBe(1);
    await page.getByLabel("Proof").selectOption("unproven");
    await page.waitForURL((u) => u.searchParams.get("proof") === "unproven");
    await page.getByRole("row", { name: new RegExp(title) }).waitFor({ state: "detached" });
    await page.getByLabel("Proof").selectOption("proven");
    await row.waitFor();
    await screenshot(page, "evidence-plans-proven");
    expect(errors).toEqual([]);
  }, 90_000);
});
