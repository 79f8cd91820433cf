import fs from "node:fs";
import path from "node:path";
import {
  chromium,
  type Browser,
  type BrowserContext,
  type CDPSession,
  type Download,
  type Page,
} from "playwright-core";

const root = path.resolve(import.meta.dirname, "../..");
export const SCREENSHOT_DIR = path.join(root, "artifacts/screenshots");

/** Debian's Chromium; the inner binary starts faster than the /usr/bin wrapper script. */
function chromiumPath(): string {
  if (process.env.CHROMIUM_PATH) return process.env.CHROMIUM_PATH;
  return fs.existsSync("/usr/lib/chromium/chromium") ? "/usr/lib/chromium/chromium" : "/usr/bin/chromium";
}

export const LAUNCH_OPTIONS = {
  executablePath: chromiumPath(),
  headless: true,
  args: [
    "--no-sandbox",
    "--disable-gpu",
    "--disable-quic",
    "--no-first-run",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
  ],
};
/** Set by tests/setup/global-browser.ts: the one Chromium the e2e files share for the run. */
export const BROWSER_ENDPOINT_ENV = "ROPEWALK_TEST_BROWSER_WS";

/**
 * Connects to the run's shared Chromium (a few hundred milliseconds instead of seconds per file for a launch
 * and a close); launches one of its own when run outside the e2e project. Each file still works in its own
 * contexts, and `close()` on a connected browser closes only those.
 */
export async function launchBrowser(): Promise<Browser> {
  const shared = process.env[BROWSER_ENDPOINT_ENV];
  const browser = await (shared ? chromium.connect(shared) : chromium.launch(LAUNCH_OPTIONS));
  const rate = cpuSlowdown();
  return rate ? withCpuSlowdown(browser, rate) : browser;
}

/**
 * `E2E_CPU_SLOWDOWN=<n>` runs the page under test n times slower (CDP Emulation.setCPUThrottlingRate), so a test that
 * reads the screen before it has drawn fails on a fast machine the way it would on a busy CI one. Off when unset.
 */
export const CPU_SLOWDOWN_ENV = "E2E_CPU_SLOWDOWN";

function cpuSlowdown(): number | null {
  const raw = process.env[CPU_SLOWDOWN_ENV]?.trim();
  if (!raw) return null;
  const rate = Number(raw);
  if (!Number.isFinite(rate) || rate < 1)
    throw new Error(`${CPU_SLOWDOWN_ENV} must be a number of at least 1, got "${raw}"`);
  return rate > 1 ? rate : null;
}

/**
 * Every page the tests open goes through `browser.newContext()` (`browser.newPage()` calls it too) and then
 * `context.newPage()`, so the throttle is set here once for all files: `newPage()` resolves only once the page is
 * throttled, and a page the app opens itself (a report in a new tab) is throttled as soon as it appears.
 * Only the newest open page of the file is slowed; the one before gets its full speed back, and is slowed again when
 * the newer one closes. Chromium's throttle keeps a renderer busy even when its page is idle (about half a core per
 * throttled page on our 2-core machine), and the files keep every page open until they end: slowing them all slowed
 * the machine (a 13-page file took minutes) rather than the page under test. Each page's CDP session stays attached
 * for its life; detaching it would drop the throttle.
 */
function withCpuSlowdown(browser: Browser, rate: number): Browser {
  type Open = { page: Page; cdp: Promise<CDPSession>; slowed: Promise<void> };
  const open: Open[] = []; // oldest first; the last one is slowed
  const setRate = (o: Open, r: number) =>
    o.cdp.then((cdp) => cdp.send("Emulation.setCPUThrottlingRate", { rate: r })).then(() => undefined);
  const quietly = (p: Promise<void>) => void p.catch(() => undefined); // the page may have closed meanwhile
  const slow = (page: Page): Promise<void> => {
    const known = open.find((o) => o.page === page);
    if (known) return known.slowed;
    const previous = open.at(-1);
    const cdp = page.context().newCDPSession(page);
    const o: Open = { page, cdp, slowed: Promise.resolve() };
    o.slowed = setRate(o, rate);
    open.push(o);
    if (previous) quietly(setRate(previous, 1));
    page.once("close", () => {
      const i = open.indexOf(o);
      if (i < 0) return;
      open.splice(i, 1);
      const newest = open.at(-1);
      if (i === open.length && newest) quietly(setRate(newest, rate));
    });
    return o.slowed;
  };
  const newContext = browser.newContext.bind(browser);
  browser.newContext = async (...args: Parameters<Browser["newContext"]>): Promise<BrowserContext> => {
    const context = await newContext(...args);
    context.on("page", (page) => quietly(slow(page)));
    const newPage = context.newPage.bind(context);
    context.newPage = async () => {
      const page = await newPage();
      await slow(page);
      return page;
    };
    return context;
  };
  return browser;
}

/** The text of a finished download; `download.path()` is unavailable on a connected browser, so it is streamed. */
export async function downloadedText(download: Download): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const chunk of await download.createReadStream()) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks).toString("utf8");
}

/** Full-page picture of the current screen, kept in artifacts/ (git-ignored) for people to look at. */
export async function screenshot(page: Page, name: string): Promise<string> {
  fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const file = path.join(SCREENSHOT_DIR, `${name}.png`);
  // "disabled" fast-forwards CSS transitions so a pill caught mid-hover does not look washed out.
  // Very long pages (a mail list holding every test file's messages) are pictured as far as 4000 px: a full capture
  // of tens of thousands of pixels takes longer than the screenshot timeout on a busy 2-core machine.
  const height = await page.evaluate(() => document.documentElement.scrollHeight);
  const width = page.viewportSize()?.width ?? 1280;
  await page.screenshot({
    path: file,
    animations: "disabled",
    ...(height > 4000 ? { clip: { x: 0, y: 0, width, height: 4000 }, fullPage: true } : { fullPage: true }),
  });
  return file;
}

/** Fills and sends the sign-in form the page is showing (for attempts that may be refused). */
export async function submitSignIn(page: Page, who: { email: string; password: string }): Promise<void> {
  await page.getByLabel("E-mail").fill(who.email);
  await page.getByLabel("Password").fill(who.password);
  await page.getByRole("button", { name: "Sign in" }).click();
}

/** Signs in through the form the page is showing and waits until the app has moved past it. */
export async function signIn(page: Page, who: { email: string; password: string }): Promise<void> {
  await submitSignIn(page, who);
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"));
}

const BUILT_CLIENT = path.join(root, "dist/client/index.html");
/** Browser tests click through the built client; say so plainly when it is missing. */
export function requireBuiltClient() {
  if (!fs.existsSync(BUILT_CLIENT))
    throw new Error("dist/client is missing: run `npm run build` before the browser tests");
}
