import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, BrowserContext } from "playwright-core";
import { launchBrowser, requireBuiltClient, screenshot, signIn } from "../setup/browser";
import { makeTestApp } from "../setup/app";
import { createPlan, createProfile } from "../setup/plans";
import { startTestServer } from "../setup/server";
import { createTestUser, type TestUser } from "../setup/users";

/* Leaving the draft editor with unsaved edits asks first: in the app (a link) and for the tab (reload, close). */
let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Browser;
let researcher: TestUser;
let planId = 0;
const contexts: BrowserContext[] = [];

beforeAll(async () => {
  requireBuiltClient();
  [server, browser, researcher] = await Promise.all([
    startTestServer(),
    launchBrowser(),
    createTestUser(["researcher"], "Guarded Author"),
  ]);
  const api = await makeTestApp().signIn(researcher);
  planId = (await createPlan(api, (await createProfile(api)).id)).id;
});

afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => undefined);
  await browser?.close();
  await server?.close();
});

describe("unsaved draft edits", () => {
  it("a link asks before discarding them; staying keeps the edit; a reload gets the browser's question", async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    contexts.push(context);
    const page = await context.newPage();
    const edit = `/plans/${planId}/revisions/1/edit`;
    await page.goto(`${server.url}${edit}`);
    await signIn(page, researcher);
    const notes = page.getByLabel("Notes for inspectors");
    await notes.waitFor({ timeout: 20_000 });

    // Nothing typed yet: the link just goes.
    await page.getByRole("link", { name: "Plans", exact: true }).first().click();
    await page.waitForURL((u) => u.pathname === "/plans");
    await page.goBack();
    await notes.waitFor({ timeout: 20_000 });

    await notes.fill("warm-up doubled after the first run");
    await page.getByRole("link", { name: "Plans", exact: true }).first().click();
    const ask = page.getByRole("dialog", { name: "Leave with unsaved changes?" });
    await ask.waitFor();
    await screenshot(page, "draft-leave-guard");
    await ask.getByRole("button", { name: "Stay and keep editing" }).click();
    expect(new URL(page.url()).pathname).toBe(edit);
    expect(await notes.inputValue()).toBe("warm-up doubled after the first run");

    // Reloading the tab: the browser's own beforeunload question; dismissing it keeps the page.
    // Wait for the question itself, not a fixed few seconds of the reload.
    const asked: string[] = [];
    const question = page.waitForEvent("dialog");
    page.once("dialog", (d) => {
      asked.push(d.type());
      void d.dismiss();
    });
    // Dismissed, the reload never finishes: it is left to fail on its own (or with the context).
    void page.reload().catch(() => undefined);
    await question;
    expect(asked).toEqual(["beforeunload"]);
    expect(await notes.inputValue()).toBe("warm-up doubled after the first run");

    await page.getByRole("link", { name: "Plans", exact: true }).first().click();
    await ask.getByRole("button", { name: "Leave and discard" }).click();
    await page.waitForURL((u) => u.pathname === "/plans");
  }, 120_000);
});
