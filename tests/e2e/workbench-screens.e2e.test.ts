import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { METHOD_CATALOG, type MethodId } from "../../shared/methods";
import { launchBrowser, requireBuiltClient, screenshot, signIn } from "../setup/browser";
import { startTestServer } from "../setup/server";
import { createTestUser, type TestUser } from "../setup/users";

/*
 * Issue 15, the workbench part: results are labelled by the request that produced them (and marked stale when the
 * inputs no longer match), and the page fits a 390 px phone.
 */
let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Browser;
let researcher: TestUser;

beforeAll(async () => {
  requireBuiltClient();
  [server, browser, researcher] = await Promise.all([
    startTestServer(),
    launchBrowser(),
    createTestUser(["researcher", "infra"], "Stella Stale"),
  ]);
});

afterAll(async () => {
  await browser?.close();
  await server?.close();
});

const label = (id: MethodId) => METHOD_CATALOG[id].label;

/** A typed-in shape (d = 128, b = 10 000, L = 4 096) to 32 768 tokens, with the given method rows. */
const workbenchUrl = (methods: [MethodId, Record<string, string>][]) =>
  `/workbench?shape=128,10000,4096,1&target=32768&methods=${encodeURIComponent(JSON.stringify(methods))}`;

const analysed = (page: Page, count: number) =>
  page.waitForResponse(
    (r) =>
      r.url().endsWith("/api/analyses") &&
      r.request().method() === "POST" &&
      JSON.parse(r.request().postData() ?? "{}").methods?.length === count,
  );

async function openWorkbench(width: number, methods: [MethodId, Record<string, string>][]) {
  const context = await browser.newContext({ viewport: { width, height: 900 }, acceptDownloads: true });
  const page = await context.newPage();
  const errors: string[] = [];
  page.on("pageerror", (e) => errors.push(e.message));
  page.on("console", (m) => {
    if (m.type() === "error" && !m.text().startsWith("Failed to load resource")) errors.push(m.text());
  });
  await page.goto(`${server.url}${workbenchUrl(methods)}`);
  const answered = analysed(page, methods.length);
  await signIn(page, researcher);
  const analysis = await (await answered).json();
  return { context, page, errors, analysis };
}

describe("workbench results are labelled by the request that made them", () => {
  it("invalid inputs leave the last figures dimmed and marked stale, each still named by its own method", async () => {
    // Eight rows, the last three NTK-aware, as a person adding methods one by one leaves them.
    const rows: [MethodId, Record<string, string>][] = [
      ["linear", {}],
      ["yarn", {}],
      ["dynamic", {}],
      ["llama3", {}],
      ["default", {}],
      ["ntk", {}],
      ["ntk", {}],
      ["ntk", {}],
    ];
    const { context, page, errors, analysis } = await openWorkbench(1440, rows);
    const cards = page.getByRole("article");
    await expect.poll(() => cards.count()).toBe(8);
    const results = page.getByTestId("workbench-results");
    expect(await results.getAttribute("data-stale")).toBeNull();

    // Row 6 becomes LongRoPE without factors, row 7 an adjusted base without b′, row 1 plain RoPE: no valid request.
    await page.getByLabel("Method 6", { exact: true }).selectOption("longrope");
    await page.getByLabel("Method 7", { exact: true }).selectOption("base");
    await page.getByLabel("Method 1", { exact: true }).selectOption("default");
    await expect.poll(() => results.getAttribute("data-stale")).toBe("invalid");

    // The figures on screen are still the answer to the eight-row request: every card carries that request's method.
    const shown = analysis.methods.map((m: { method: MethodId }) => m.method);
    for (let i = 0; i < 8; i++) {
      const card = cards.nth(i);
      expect(await card.getAttribute("aria-label")).toBe(`Method ${i + 1}: ${label(shown[i])}`);
      // The copy button names the method of the card it sits on, and copies that card's keys.
      await card.getByRole("button", { name: `Copy the config keys of ${label(shown[i])}` }).waitFor();
      expect(JSON.parse((await card.getByTestId("export-block").textContent())!)).toEqual(
        analysis.methods[i].ropeScaling,
      );
    }
    // Card 1 is position interpolation (rope_type linear), not the plain RoPE row 1 now asks for.
    expect(JSON.parse((await cards.first().getByTestId("export-block").textContent())!).rope_scaling.rope_type).toBe(
      "linear",
    );
    // Where a row now asks for another method, the card says so instead of borrowing the row's name.
    for (const [i, now] of [
      [0, "default"],
      [5, "longrope"],
      [6, "base"],
    ] as const) {
      expect(await cards.nth(i).getByTestId("stale-row-note").textContent()).toContain(label(now));
    }
    await expect(cards.nth(1).getByTestId("stale-row-note").count()).resolves.toBe(0);
    // Legends and pickers read the request's names too.
    const picker = page.getByLabel("Method shown").first();
    expect(await picker.locator("option").allTextContents()).toEqual(
      shown.map((m: MethodId, i: number) => `${i + 1}. ${label(m)}`),
    );
    // Marked in words and dimmed.
    const banner = page.getByTestId("stale-banner");
    expect(await banner.textContent()).toMatch(/stale/i);
    // The dimming is a CSS transition: read the opacity until it has started, not once at the transition's first frame.
    await expect
      .poll(() => page.getByTestId("stale-figures").evaluate((el) => Number(getComputedStyle(el).opacity)), {
        timeout: 10_000,
      })
      .toBeLessThan(1);
    await screenshot(page, "workbench-stale");

    // Fixing the rows brings fresh figures under the new names, no longer marked.
    const fresh = analysed(page, 8);
    await page.getByLabel("Method 6", { exact: true }).selectOption("ntk");
    await page.getByLabel("Method 7", { exact: true }).selectOption("dynamic");
    const answer = await (await fresh).json();
    expect(answer.methods[0].method).toBe("default");
    await expect.poll(() => results.getAttribute("data-stale")).toBeNull();
    await expect.poll(() => cards.first().getAttribute("aria-label")).toBe(`Method 1: ${label("default")}`);
    await expect.poll(() => cards.nth(6).getAttribute("aria-label")).toBe(`Method 7: ${label("dynamic")}`);
    expect(errors).toEqual([]);
    await context.close();
  }, 90_000);
});

/** Wider than the viewport means the page scrolls sideways: the whole document must fit. */
const pageWidth = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth);

describe("the workbench and the estimator on a phone and on a wide screen", () => {
  it("at 390 px neither page scrolls sideways and the charts draw inside their panels", async () => {
    const rows: [MethodId, Record<string, string>][] = [
      ["linear", {}],
      ["yarn", {}],
      ["llama3", {}],
    ];
    const { context, page, errors } = await openWorkbench(390, rows);
    await page.getByRole("article").first().waitFor({ timeout: 15_000 });
    for (const id of ["spectrum-chart", "ratio-chart", "decay-chart"]) {
      const chart = page.getByTestId(id);
      await chart.scrollIntoViewIfNeeded();
      // The svg follows its container, which follows the 390 px viewport (before: drawn 640 px wide).
      await expect
        .poll(() => chart.evaluate((el) => el.querySelector("svg")!.getBoundingClientRect().right), { timeout: 10_000 })
        .toBeLessThanOrEqual(390);
    }
    // Before: 706 px.
    await expect.poll(() => pageWidth(page), { timeout: 10_000 }).toBeLessThanOrEqual(390);
    await screenshot(page, "workbench-390");

    // Before: 796 px (a hidden "Remove" label in the stage table escaped its scrolling frame).
    await page.goto(`${server.url}/estimator`);
    await page.getByRole("heading", { level: 1, name: "Budget estimator" }).waitFor();
    await page.getByRole("table", { name: "Stages" }).waitFor({ timeout: 15_000 });
    await expect.poll(() => pageWidth(page), { timeout: 10_000 }).toBeLessThanOrEqual(390);
    await screenshot(page, "estimator-390");
    expect(errors).toEqual([]);
    await context.close();
  }, 90_000);

  it("at 1440 px the inputs stay beside the figures in a sticky panel, and each method row folds", async () => {
    const rows: [MethodId, Record<string, string>][] = [
      ["yarn", { betaFast: "24" }],
      ["dynamic", {}],
    ];
    const { context, page, errors } = await openWorkbench(1440, rows);
    await page.getByRole("article").first().waitFor({ timeout: 15_000 });
    // The dynamic factor's default is explained beside it: s = 32 768 / 4 096 = 8, so at L′ the base grows
    // (1 + 8·7)^(64/63) = 57^(64/63) ≈ 60.8 times; f = 1 (the NTK-aware base at s = 8) 8^(64/63) ≈ 8.27 times.
    const dynamicRow = page.getByTestId("method-row-1");
    await expect.poll(() => dynamicRow.textContent(), { timeout: 10_000 }).toContain("f = L′/L = 8");
    expect(await dynamicRow.textContent()).toContain("×60.8");
    expect(await dynamicRow.textContent()).toContain("×8.27");
    const inputs = page.getByTestId("workbench-inputs");
    expect(await inputs.evaluate((el) => getComputedStyle(el).position)).toBe("sticky");
    // The charts start beside the inputs, not below them: the first chart is in view without scrolling.
    const inputsBox = (await inputs.boundingBox())!;
    const chartBox = (await page.getByTestId("spectrum-chart").boundingBox())!;
    expect(chartBox.x).toBeGreaterThanOrEqual(inputsBox.x + inputsBox.width);
    expect(chartBox.y).toBeLessThan(900);
    // After scrolling to the pair table the inputs are still on screen.
    await page.getByRole("table", { name: /^Pairs of/ }).scrollIntoViewIfNeeded();
    const stuck = (await inputs.boundingBox())!;
    expect(stuck.y).toBeGreaterThanOrEqual(0);
    expect(stuck.y).toBeLessThan(100);

    // Folding a row hides its parameters and says how many are set; unfolding brings them back as typed.
    const row = page.getByTestId("method-row-0");
    await row.getByRole("button", { name: "Fold the parameters of method 1" }).click();
    await row.getByLabel("β fast (rotations)").waitFor({ state: "detached" });
    await expect(row.getByLabel("β fast (rotations)").count()).resolves.toBe(0);
    expect(await row.getByRole("button", { name: "Unfold the parameters of method 1" }).textContent()).toContain(
      "1 set",
    );
    expect(await page.getByLabel("Method 1", { exact: true }).inputValue()).toBe("yarn");
    await screenshot(page, "workbench-1440-folded");
    await row.getByRole("button", { name: "Unfold the parameters of method 1" }).click();
    expect(await row.getByLabel("β fast (rotations)").inputValue()).toBe("24");
    expect(errors).toEqual([]);
    await context.close();
  }, 90_000);
});
