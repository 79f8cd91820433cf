import type { Browser, BrowserContext, Page } from "playwright-core";
import { signIn } from "./browser";
import type { TestUser } from "./users";

/**
 * Signed-in pages for a browser test file, each in its own context (its own session), with every page error and
 * console error collected in `errors` so the file can end by asserting the screens raised none.
 * Moved out of tests/e2e/layouts.e2e.test.ts so the lineage test reuses it rather than copying it. `width` is the
 * viewport width `signedIn` uses when a call names none (files whose screenshots were taken at 1280 keep it).
 */
export function signedInPages(browser: () => Browser, baseUrl: () => string, defaults: { width?: number } = {}) {
  const contexts: BrowserContext[] = [];
  const errors: string[] = [];

  async function signedIn(who: TestUser, to: string, width = defaults.width ?? 1360): Promise<Page> {
    const context = await browser().newContext({ viewport: { width, height: 900 }, acceptDownloads: true });
    contexts.push(context);
    const page = await context.newPage();
    page.on("pageerror", (e) => errors.push(`${who.name}: ${e.message}`));
    // The browser's own line for an expected 4xx ("Failed to load resource") is not an application error.
    page.on("console", (m) => {
      if (m.type() === "error" && !m.text().startsWith("Failed to load resource"))
        errors.push(`${who.name}: ${m.text()}`);
    });
    await page.goto(`${baseUrl()}${to}`);
    await signIn(page, who);
    return page;
  }

  async function closeAll(): Promise<void> {
    for (const c of contexts) await c.close().catch(() => undefined);
  }

  return { signedIn, closeAll, errors };
}
