import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { launchBrowser, requireBuiltClient, screenshot } from "../setup/browser";
import { signedInPages } from "../setup/signed-in";
import { startTestServer } from "../setup/server";
import { createTestUser, type TestUser } from "../setup/users";

// The Audit page tells admins whether the trail's hash chain holds (GET /api/audit/verify); approvers see the trail only.
let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Browser;
let admin: TestUser;
let approver: TestUser;
const { signedIn, closeAll, errors } = signedInPages(
  () => browser,
  () => server.url,
  { width: 1280 },
);

beforeAll(async () => {
  requireBuiltClient();
  [server, browser, admin, approver] = await Promise.all([
    startTestServer(),
    launchBrowser(),
    createTestUser(["admin"], "Seal Admin"),
    createTestUser(["approver"], "Seal Approver"),
  ]);
});
afterAll(async () => {
  await closeAll();
  await browser?.close();
  await server?.close();
});

describe("audit seals on the Audit page", () => {
  it("an admin sees that every entry is still chained; an approver is not shown the check", async () => {
    const page = await signedIn(admin, "/audit");
    const status = page.getByTestId("chain-status");
    await status.getByText("Trail intact").waitFor({ timeout: 20_000 });
    expect(await status.textContent()).toMatch(/All [\d,]+ entries are sealed/);
    await screenshot(page, "audit-seals");

    const other = await signedIn(approver, "/audit");
    await other.getByRole("table", { name: "Audit trail" }).waitFor({ timeout: 20_000 });
    expect(await other.getByTestId("chain-status").count()).toBe(0);
    expect(errors).toEqual([]);
  }, 60_000);
});
