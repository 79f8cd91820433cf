import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { downloadedText, launchBrowser, requireBuiltClient, screenshot } from "../setup/browser";
import { startTestServer } from "../setup/server";
import { importConfigThroughUi } from "../setup/import-config";
import { draftPlanInForm } from "../setup/plan-form";
import { signedInPages } from "../setup/signed-in";
import { createTestUser, type TestUser } from "../setup/users";

/*
 * Issue 11 end to end: a layered model (five local-window layers with their own base 10 000 per full-attention layer
 * with base 1e6, trained 16 384) goes from its config.json through the import screen, a plan drafted in the form and
 * an approval, to an export whose local layers are exactly as trained.
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
const modelName = `Windowed ${stamp}`;
const title = `Windowed to 64k ${stamp}`;

beforeAll(async () => {
  requireBuiltClient();
  [server, browser, researcher, approver] = await Promise.all([
    startTestServer(),
    launchBrowser(),
    createTestUser(["researcher"], "Lena Layers"),
    createTestUser(["approver"], "Otis Approver"),
  ]);
});

afterAll(async () => {
  await closeAll();
  await browser?.close();
  await server?.close();
});

describe("a layered model from import to an approved export", () => {
  let planId = 0;

  it("imports the config: the preview shows the local and full layers apart, and the profile keeps them", async () => {
    const page = await signedIn(researcher, "/models/import");
    await importConfigThroughUi(page, "sliding-full-local-base.json", modelName, async () => {
      const groups = page.getByTestId("profile-layer-groups");
      await groups.waitFor();
      const local = groups.locator('tr[data-kind="sliding_attention"]');
      await expect.poll(() => local.textContent()).toContain("plain RoPE, unscaled");
      expect(await local.textContent()).toContain("0–4, 6–10");
      expect(await groups.locator('tr[data-kind="full_attention"]').textContent()).toContain("linear ×8");
      await screenshot(page, "layouts-import-preview");
    });
    await page.getByTestId("profile-layer-groups").waitFor();

    // The workbench analyses one group at a time; it opens on the group plans scale (full attention, base 1e6).
    await page.getByRole("link", { name: "Open in the workbench" }).click();
    const picker = page.getByRole("combobox", { name: "Layer group", exact: true });
    await picker.waitFor();
    // The picker is drawn before the profile's groups fill it and pick the default.
    await expect.poll(() => picker.inputValue()).toBe("full_attention");
    const status = page.getByTestId("analysis-status");
    await expect.poll(() => status.textContent()).toContain("d = 256 (128 pairs), b = 1 × 10⁶");
    await picker.selectOption("sliding_attention");
    await page.waitForURL((u) => u.searchParams.get("group") === "sliding_attention");
    await expect.poll(() => status.textContent()).toMatch(/b = 10[,\s\u202f]?000,/);
    await screenshot(page, "layouts-workbench-local-group");
  }, 120_000);

  it("drafts a plan in the form; the plan page shows the local layers kept as trained; submits it", async () => {
    const page = await signedIn(researcher, "/plans");
    planId = await draftPlanInForm(page, { title, modelName, method: "yarn", target: 65536 });
    const groups = page.getByTestId("group-results");
    await groups.waitFor({ timeout: 15_000 });
    const local = groups.locator('tr[data-kind="sliding_attention"]');
    expect(await local.textContent()).toContain("kept as trained");
    // Local layers attend over their 1 024-token window, inside the trained 16 384: nothing is flagged.
    expect(await local.textContent()).toContain("no pair sees unseen angles");
    expect(await groups.locator('tr[data-kind="full_attention"]').textContent()).toContain("takes the plan's method");
    await screenshot(page, "layouts-plan-groups");
    await page.getByRole("button", { name: "Send to inspection" }).click();
    await expect.poll(() => page.getByRole("list", { name: "Revisions" }).textContent()).toContain("At inspection");
  }, 60_000);

  it("an approver signs it; the export nests rope_parameters by layer type with the local layers untouched", async () => {
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
    // The local layers: exactly their trained setting, plain RoPE over their own base, no scaling block.
    expect(envelope.ropeParametersByLayerType.sliding_attention).toEqual({ rope_type: "default", rope_theta: 10000 });
    const local = envelope.layerGroups.find((g: { kind: string }) => g.kind === "sliding_attention");
    expect(local).toMatchObject({ method: "default", ropeTheta: 10000, layers: [0, 1, 2, 3, 4, 6, 7, 8, 9, 10] });
    expect(local.config.rope_scaling).toBeNull();
    // The full-attention layers: YaRN over base 1e6 from the pre-training length 16 384 to 65 536 (factor 4).
    expect(envelope.ropeParametersByLayerType.full_attention).toMatchObject({
      rope_type: "yarn",
      rope_theta: 1000000,
      factor: 4,
      original_max_position_embeddings: 16384,
    });
    expect(errors).toEqual([]);
  }, 60_000);
});
