import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { downloadedText, launchBrowser, requireBuiltClient, screenshot } from "../setup/browser";
import { startTestServer } from "../setup/server";
import { importConfigThroughUi } from "../setup/import-config";
import { signedInPages } from "../setup/signed-in";
import { createTestUser, type TestUser } from "../setup/users";

/*
 * Issue 11 lineage end to end: a model whose config already ships YaRN ×4 (pre-trained 8192, served 32768) goes
 * through the import screen, a plan that stretches its served length ×4 more, and an approval, to an export that
 * carries one block over the pre-trained length: 4 × 32768/8192 = 16 = 131072/8192 (the values of
 * tests/api/plans/lineage.test.ts; the loaders' reading is cited in shared/lineage.ts).
 */
let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Browser;
let researcher: TestUser;
let approver: TestUser;
const { signedIn, closeAll, errors } = signedInPages(
  () => browser,
  () => server.url,
);
const stamp = Date.now().toString(36);
const modelName = `Laid rope ${stamp}`;
const title = `Laid rope to 128k ${stamp}`;
/** 8192 / 32 768 / 131 072 as the screens group digits (a comma, a space or none, by locale). */
const count = (n: number) => new RegExp(String(n).replace(/(\d+)(\d{3})$/, "$1[,\\s\\u202f]?$2"));

beforeAll(async () => {
  requireBuiltClient();
  [server, browser, researcher, approver] = await Promise.all([
    startTestServer(),
    launchBrowser(),
    createTestUser(["researcher"], "Rhea Lineage"),
    createTestUser(["approver"], "Abel Approver"),
  ]);
});

afterAll(async () => {
  await closeAll();
  await browser?.close();
  await server?.close();
});

describe("an already-scaled model extended from its served length", () => {
  let planId = 0;

  it("imports the config: the model page shows the pre-trained and the served length; the legends name it as shipped", async () => {
    const page = await signedIn(researcher, "/models/import");
    await importConfigThroughUi(page, "already-scaled-yarn.json", modelName);

    const facts = page.getByTestId("profile-facts");
    const fact = (name: string) => facts.locator("dt", { hasText: name }).locator("xpath=following-sibling::dd[1]");
    expect(await fact("Pre-trained length").textContent()).toMatch(count(8192));
    const served = await fact("Served length").textContent();
    expect(served).toMatch(count(32768));
    expect(served).toContain("as shipped: yarn ×4");
    await screenshot(page, "lineage-model");

    // The workbench offers the model as shipped as a row; its legend entry is named like the row, not "YaRN".
    await page.getByRole("link", { name: "Open in the workbench" }).click();
    await page.getByRole("button", { name: "Compare with the model as shipped (yarn ×4)" }).click();
    // the wavelength chart draws method 1 (the shipped row, added first); the ratio and decay legends number them
    const legends = page.getByRole("list", { name: "Legend" });
    await expect
      .poll(() => legends.first().textContent(), { timeout: 20_000 })
      .toContain("λ′ after As shipped (yarn ×4)");
    // The other charts (and their legends) draw on their own, once their frames have a width.
    await expect
      .poll(() => legends.allTextContents(), { timeout: 20_000 })
      .toContainEqual(expect.stringContaining("1. As shipped (yarn ×4)"));
    await screenshot(page, "lineage-workbench");
  }, 120_000);

  it("drafts a plan extending the served length ×4 and sends it to inspection", async () => {
    const page = await signedIn(researcher, "/plans");
    await page.getByRole("link", { name: "New plan" }).click();
    const form = page.getByRole("form", { name: "New plan" });
    await form.waitFor();
    await form.getByLabel("Title").fill(title);
    // The picker offers one page of profiles; its search finds this one wherever it sorts.
    await page.getByLabel("Find a model profile").fill(modelName);
    await form.getByLabel("Model", { exact: true }).selectOption({ label: modelName });
    const from = form.getByLabel("Extends from");
    await from.waitFor();
    await expect
      .poll(() => from.locator("option").allTextContents())
      .toEqual([
        expect.stringMatching(/^Pre-trained length \(8[,\s\u202f]?192 tokens\)$/),
        expect.stringMatching(/^Served length \(32[,\s\u202f]?768 tokens, as shipped: yarn ×4\)$/),
      ]);
    await from.selectOption("served");
    await form.getByLabel("Method", { exact: true }).selectOption("yarn");
    await form.getByLabel("Factor s (optional)").first().fill("4");
    await form.getByLabel("Target context (tokens)").first().fill("131072");
    await screenshot(page, "lineage-plan-form");
    await form.getByRole("button", { name: "Save draft" }).click();
    await page.waitForURL(/\/plans\/\d+$/);
    planId = Number(new URL(page.url()).pathname.split("/").pop());
    await page.getByRole("button", { name: "Send to inspection" }).click();
    await expect.poll(() => page.getByRole("list", { name: "Revisions" }).textContent()).toContain("At inspection");
    await screenshot(page, "lineage-plan");
  }, 60_000);

  it("an approver signs it; the export is factor 16 over the pre-trained 8192, the author's ×4 kept as typed", async () => {
    expect(planId).toBeGreaterThan(0);
    const page = await signedIn(approver, `/plans/${planId}`);
    await page.getByRole("button", { name: "Inspect revision 1" }).click();
    const dialog = page.getByRole("dialog");
    await dialog.waitFor();
    await dialog.getByRole("button", { name: "Sign and pass" }).click();
    await page.getByText("Revision 1 passed inspection and is signed.").waitFor();

    const owner = await signedIn(researcher, `/plans/${planId}`);
    await expect.poll(() => owner.getByRole("list", { name: "Revisions" }).textContent()).toContain("Passed");
    const [download] = await Promise.all([
      owner.waitForEvent("download"),
      owner.getByRole("link", { name: "Download export (config patch JSON)" }).click(),
    ]);
    const envelope = JSON.parse(await downloadedText(download));
    // ×4 on the served 32 768 = 131 072 = 16 × 8192: one block over the pre-trained length, never ×4 alone or ×4·×4
    // stacked as two blocks.
    expect(envelope.config).toMatchObject({
      rope_scaling: { rope_type: "yarn", factor: 16, original_max_position_embeddings: 8192 },
      max_position_embeddings: 131072,
    });
    expect(envelope).toMatchObject({ extendsFrom: "served", startContext: 32768 });
    // the revision keeps what the author typed
    const rev = await owner.request.get(`${server.url}/api/plans/${planId}/revisions/1`);
    expect((await rev.json()).content.method).toMatchObject({ method: "yarn", factor: 4 });
    await screenshot(owner, "lineage-approved");
    expect(errors).toEqual([]);
  }, 60_000);
});
