import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { launchBrowser, screenshot, requireBuiltClient } from "../setup/browser";
import { makeTestApp } from "../setup/app";
import { createPlan, createProfile, post } from "../setup/plans";
import { probeDocument } from "../setup/probe";
import { signedInPages } from "../setup/signed-in";
import { startTestServer } from "../setup/server";
import { createTestUser, type TestUser } from "../setup/users";

// The conformance matrix in its three places (workbench, plan page, decision dialog), the export menu and a probe upload.
const TARGETS = ["transformers-v4-early", "transformers-v4", "transformers-v5", "vllm", "sglang", "llama-cpp"];
const STATUSES = ["exact", "equivalent", "differs", "unsupported"];

let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Browser;
let researcher: TestUser;
let approver: TestUser;
let planId = 0;
const { signedIn, closeAll, errors } = signedInPages(
  () => browser,
  () => server.url,
  { width: 1280 },
);

beforeAll(async () => {
  requireBuiltClient();
  [server, browser, researcher, approver] = await Promise.all([
    startTestServer(),
    launchBrowser(),
    createTestUser(["researcher"], "Rhea Rigger"),
    createTestUser(["approver"], "Abel Checker"),
  ]);
  // Sample profile: 128-dim heads, base 10 000, trained on 4096 tokens; a linear ×8 plan to 32k, in review.
  const api = await makeTestApp().signIn(researcher);
  const profile = await createProfile(api);
  const revision = {
    targetContext: 32768,
    method: { method: "linear", factor: 8 },
    stages: [],
    acceptance: [],
    notes: "",
  };
  planId = (await createPlan(api, profile.id, { revision })).id;
  await post(api, `/api/plans/${planId}/revisions/1/submit`).expect(200);
});

afterAll(async () => {
  await closeAll();
  await browser?.close();
  await server?.close();
});

/** Every target has a row with one of the four fixed statuses, and the fingerprint is a SHA-256. */
async function expectMatrix(scope: ReturnType<Page["getByTestId"]>, { fingerprint = true } = {}) {
  const matrix = scope.getByTestId("conformance-matrix");
  await matrix.waitFor({ timeout: 20_000 });
  for (const id of TARGETS) {
    const status = await matrix.locator(`tr[data-target="${id}"] [data-status]`).getAttribute("data-status");
    expect(STATUSES).toContain(status);
  }
  if (fingerprint) expect(await matrix.getByTestId("rotary-fingerprint").textContent()).toMatch(/^[0-9a-f]{64}$/);
  return matrix;
}

describe("probe checks on a layered plan", () => {
  it("the plan page lists each layer group's result under the check", async () => {
    // sliding-full-local-base.json: head_dim 256; local layers 0–4 and 6–10 over base 1e4, full layers 5 and 11 over
    // 1e6; a linear ×4 plan to 65 536 scales the full layers only (θ/4, Chen et al. 2023) and keeps the local ones.
    const api = await makeTestApp().signIn(researcher);
    const config = fs.readFileSync(path.join(import.meta.dirname, "../fixtures/configs/sliding-full-local-base.json"));
    const saved = await api
      .post("/api/models/import?save=true")
      .set("X-CSRF-Token", api.csrf)
      .field("overrides", JSON.stringify({ name: `Layered hawser ${Date.now()}`, parameters: 3e9 }))
      .attach("file", config, "config.json")
      .expect(201);
    const layered = await createPlan(api, saved.body.saved.id, {
      title: `Layered probe ${Date.now()}`,
      revision: { targetContext: 65536, method: { method: "linear", factor: 4 } },
    });
    // A reading that scaled the local layers too: they slip by 3/4 on every pair, the full layers hold.
    const theta = (b: number, s: number) => Array.from({ length: 128 }, (_, i) => b ** ((-2 * i) / 256) / s);
    const group = (layerType: string, layers: number[], invFreq: number[]) => ({
      layerType,
      layers,
      ropeType: "linear",
      rotaryDim: 256,
      attentionFactor: 1,
      invFreq,
    });
    const local = [0, 1, 2, 3, 4, 6, 7, 8, 9, 10];
    const doc = {
      ...probeDocument(256, 1e6, 4),
      runningLength: 65536,
      layerType: "full_attention",
      layerGroups: [group("sliding_attention", local, theta(1e4, 4)), group("full_attention", [5, 11], theta(1e6, 4))],
    };
    await post(api, `/api/plans/${layered.id}/revisions/1/conformance-checks`, doc).expect(201);

    const page = await signedIn(researcher, `/plans/${layered.id}`);
    const checks = page.getByTestId("probe-checks");
    const groups = checks.locator("tr[data-check-groups]");
    await groups.waitFor({ timeout: 20_000 });
    const rows = await groups
      .locator("tr[data-group]")
      .evaluateAll((trs) => trs.map((tr) => [...tr.querySelectorAll("td")].slice(0, 3).map((td) => td.textContent)));
    expect(rows).toEqual([
      ["sliding_attention", "0–4, 6–10", "slips"],
      ["full_attention", "5, 11", "holds"],
    ]);
    await screenshot(page, "conformance-plan-groups");
  }, 60_000);
});

describe("conformance matrix in the three screens", () => {
  it("workbench: the matrix follows the method on show, with each stack's artifact", async () => {
    const methods = encodeURIComponent(JSON.stringify([["linear", { factor: 8 }]]));
    const page = await signedIn(researcher, `/workbench?shape=128,10000,4096,1&target=32768&methods=${methods}`);
    const panel = page.locator("section", { has: page.getByRole("heading", { name: "Rigging for each stack" }) });
    const matrix = await expectMatrix(panel);
    // plain linear interpolation is the one method every reader carries: the 4.4x-era library reads it as planned
    const early = await matrix
      .locator('tr[data-target="transformers-v4-early"] [data-status]')
      .getAttribute("data-status");
    expect(["exact", "equivalent"]).toContain(early);
    await panel.getByLabel("Stack to rig").selectOption("vllm");
    // The artifact shown before the choice is still on the page until the new one renders.
    await expect.poll(() => panel.getByTestId("target-artifact-text").textContent()).toContain("--max-model-len");
    await screenshot(page, "conformance-workbench");
  }, 60_000);

  it("plan page: matrix, export menu with copy, probe command with the fingerprint, and a recorded probe check", async () => {
    const page = await signedIn(researcher, `/plans/${planId}`);
    const panel = page.locator("section", { has: page.getByRole("heading", { name: "Rigging for each stack" }) });
    const matrix = await expectMatrix(panel);
    const fingerprint = (await matrix.getByTestId("rotary-fingerprint").textContent())!;
    // the revision's stored fingerprint is the one its final block compiles to
    expect(await page.getByTestId("revision-fingerprint").textContent()).toBe(fingerprint);
    await panel.getByLabel("Stack to rig").selectOption("transformers-v5");
    await expect.poll(() => panel.getByTestId("target-artifact-text").textContent()).toContain("rope_parameters");
    await panel.getByRole("button", { name: /^Copy the config\.json merge patch/ }).waitFor();

    const checks = page.getByTestId("probe-checks");
    expect(await checks.locator("pre").textContent()).toContain(`--length 32768 --fingerprint ${fingerprint}`);
    await checks.getByText("No probe checks recorded yet.").waitFor();
    const body = { ...probeDocument(128, 10000, 8), planFingerprint: fingerprint };
    await checks.locator('input[type="file"]').setInputFiles({
      name: "probe.json",
      mimeType: "application/json",
      buffer: Buffer.from(JSON.stringify(body)),
    });
    await checks.getByRole("button", { name: "Record the check" }).click();
    await checks.getByText(/^Recorded: the library's frequencies hold/).waitFor();
    await checks.locator('tr[data-check] [data-passed="true"]').waitFor();
    await screenshot(page, "conformance-plan");
  }, 60_000);

  it("decision dialog: the approver sees the matrix before signing", async () => {
    const page = await signedIn(approver, `/plans/${planId}`);
    await page.getByRole("button", { name: "Inspect revision 1" }).click();
    const dialog = page.getByRole("dialog");
    const section = dialog.getByRole("region", { name: "How each stack reads this revision" });
    await expectMatrix(section, { fingerprint: false });
    // the fingerprint is printed once in the dialog, in the signing box: the revision's stored one
    const signed = (await dialog.getByTestId("fingerprint-to-sign").textContent())!;
    expect(signed).toBe(await page.getByTestId("revision-fingerprint").textContent());
    expect((await dialog.textContent())!.split(signed).length - 1).toBe(1);
    // the matrix comes before the signature controls
    const [matrixTop, signTop] = await Promise.all([
      section.boundingBox().then((b) => b!.y),
      dialog
        .getByRole("button", { name: "Sign and pass" })
        .boundingBox()
        .then((b) => b!.y),
    ]);
    expect(matrixTop).toBeLessThan(signTop);
    await screenshot(page, "conformance-decision");
    expect(errors).toEqual([]);
  }, 60_000);
});
