import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { launchBrowser, requireBuiltClient, screenshot, signIn } from "../setup/browser";
import { startTestServer } from "../setup/server";
import { createTestUser, type TestUser } from "../setup/users";
import { RAW_VALIDATOR_TEXT } from "../setup/raw-validator-text";

/*
 * Every form sent empty answers in plain sentences that name the field ("Title is required."), never in the
 * validator's own words ("Too small: expected string to have >=1 characters") or a list of raw keys ("(title, modelId)").
 */
let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Browser;
let everyone: TestUser;
const contexts: BrowserContext[] = [];

beforeAll(async () => {
  requireBuiltClient();
  [server, browser, everyone] = await Promise.all([
    startTestServer(),
    launchBrowser(),
    createTestUser(["admin", "researcher", "infra", "approver"], "Plain Words"),
  ]);
});

afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => undefined);
  await browser?.close();
  await server?.close();
});

async function newPage(): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  contexts.push(context);
  return context.newPage();
}

/** Sends every form on the screen with its boxes as they are (empty), and returns what the screen then says. */
async function submitEveryForm(page: Page): Promise<string> {
  const forms = page.locator("form");
  const count = await forms.count();
  for (let i = 0; i < count; i++) {
    const submit = forms.nth(i).locator('button[type="submit"]').first();
    // A form whose button is hidden or held (busy, nothing to send) is left alone.
    if ((await submit.isVisible()) && (await submit.isEnabled()))
      await submit.click({ timeout: 15_000 }).catch(() => undefined);
  }
  return page.locator("body").innerText();
}

describe("empty forms answer in plain sentences", () => {
  it("the sign-in form", async () => {
    const page = await newPage();
    await page.goto(`${server.url}/sign-in`);
    await page.getByLabel("E-mail").waitFor();
    await submitEveryForm(page);
    // The form's check answers a moment after the click: wait for the sentence before reading the screen.
    await expect.poll(() => page.locator("body").innerText(), { timeout: 20_000 }).toContain("E-mail is required.");
    const text = await page.locator("body").innerText();
    expect(text).not.toMatch(RAW_VALIDATOR_TEXT);
  }, 60_000);

  it("new plan, new profile, accelerators, users and profile forms", async () => {
    const page = await newPage();
    await page.goto(`${server.url}/plans/new`);
    await signIn(page, everyone);
    const expected: Record<string, string[]> = {
      "/plans/new": ["Title is required.", "Model is required.", "Nothing was saved: check title"],
      "/models/new": ["Name is required."],
      "/accelerators": ["Name is required."],
      "/users": ["E-mail is required.", "Name is required."],
      "/profile": ["Name is required."],
    };
    for (const [url, sentences] of Object.entries(expected)) {
      await page.goto(`${server.url}${url}`);
      await page.locator("form").first().waitFor({ timeout: 20_000 });
      // Some forms render only after their page's data arrives (the accelerator form waits for the catalog): send the
      // forms once the page's requests have settled, or a form not yet drawn is never sent.
      await page.waitForLoadState("networkidle");
      await submitEveryForm(page);
      // The answers arrive as each form's check finishes; wait for every expected sentence before reading the screen.
      for (const sentence of sentences)
        await expect
          .poll(() => page.locator("body").innerText(), { message: url, timeout: 20_000 })
          .toContain(sentence);
      const text = await page.locator("body").innerText();
      await screenshot(page, `plain-messages${url.replace(/\//g, "-")}`);
      expect(text.match(RAW_VALIDATOR_TEXT)?.[0] ?? null, url).toBeNull();
    }
  }, 180_000);
});
