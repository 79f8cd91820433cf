import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { ROLES, type Role } from "../../shared/schemas";
import { launchBrowser, requireBuiltClient, signIn } from "../setup/browser";
import { makeTestApp } from "../setup/app";
import { createPlan, createProfile, decide, post } from "../setup/plans";
import { startTestServer } from "../setup/server";
import { createTestUser, type TestUser } from "../setup/users";
import { RAW_VALIDATOR_TEXT } from "../setup/raw-validator-text";

/*
 * Every client route, for every role, at a desktop (1440 px) and a phone (390 px) width: the page fits the viewport
 * (no horizontal scrolling), shows no raw validator text, and logs no console error. A picture of each screen at each
 * width lands in artifacts/screens/<width>-<screen>.png (as the first role to open it saw it; a role-gated screen's
 * refusal once as <width>-<screen>-roped-off.png) for people to look over.
 */
const SCREEN_DIR = path.resolve(import.meta.dirname, "../../artifacts/screens");
const WIDTHS = [1440, 390] as const;

let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Browser;
const users = {} as Record<Role, TestUser>;
let planId = 0;
let signedPlanId = 0;
let modelId = 0;
const contexts: BrowserContext[] = [];
const pictured = new Set<string>();

beforeAll(async () => {
  requireBuiltClient();
  fs.mkdirSync(SCREEN_DIR, { recursive: true });
  [server, browser] = await Promise.all([startTestServer(), launchBrowser()]);
  for (const role of ROLES) users[role] = await createTestUser([role], `All-screens ${role}`);
  const app = makeTestApp();
  const [researcher, approver, infra] = await Promise.all([
    app.signIn(users.researcher),
    app.signIn(users.approver),
    app.signIn(users.infra),
  ]);
  await post(infra, "/api/accelerators", {
    name: `Capstan-${Date.now().toString(36)}`,
    memoryBytes: 80e9,
    peakFlops: 1e15,
    pricePerHour: 2,
    notes: "all-screens test",
  }).expect(201);
  const model = await createProfile(researcher);
  modelId = model.id;
  // Plan with two revisions: the first sent back by an approver, the second a draft (editor, comparison).
  const plan = await createPlan(researcher, model.id, { requiredApprovals: 1 });
  planId = plan.id;
  await post(researcher, `/api/plans/${planId}/revisions/1/submit`).expect(200);
  await decide(approver, `/api/plans/${planId}/revisions/1/decisions`, {
    decision: "request_changes",
    comment: "stage two needs a longer warm-up",
  }).expect(200);
  await post(researcher, `/api/plans/${planId}/revisions`).expect(201);
  // A signed plan, so the export and signature panels appear.
  const signed = await createPlan(researcher, model.id, { requiredApprovals: 1 });
  signedPlanId = signed.id;
  await post(researcher, `/api/plans/${signedPlanId}/revisions/1/submit`).expect(200);
  await decide(approver, `/api/plans/${signedPlanId}/revisions/1/decisions`, { decision: "approve" }).expect(200);
}, 120_000);

afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => undefined);
  await browser?.close();
  await server?.close();
});

/** Every route of client/src/app/router.tsx, with real ids where the route takes one. */
const screens = (): { name: string; url: string }[] => [
  { name: "home", url: "/" },
  { name: "users", url: "/users" },
  { name: "profile", url: "/profile" },
  { name: "models", url: "/models" },
  { name: "model-new", url: "/models/new" },
  { name: "model-import", url: "/models/import" },
  { name: "model", url: `/models/${modelId}` },
  { name: "workbench", url: `/workbench?model=${modelId}` },
  { name: "estimator", url: "/estimator" },
  { name: "accelerators", url: "/accelerators" },
  { name: "plans", url: "/plans" },
  { name: "plan-new", url: "/plans/new" },
  { name: "plan", url: `/plans/${planId}` },
  { name: "plan-signed", url: `/plans/${signedPlanId}` },
  { name: "plan-edit", url: `/plans/${planId}/revisions/2/edit` },
  { name: "plan-diff", url: `/plans/${planId}/diff?a=1&b=2` },
  { name: "review", url: "/review" },
  { name: "audit", url: "/audit" },
  { name: "mail", url: "/mail" },
  { name: "not-found", url: "/no-such-screen" },
];

/** Waits until the route has drawn its heading and no loading line is left (lazy chunk and first queries settled). */
async function settle(page: Page) {
  await page.locator("h1").first().waitFor({ timeout: 60_000 });
  await page
    .waitForFunction(() => !document.querySelector('[role="status"].animate-pulse'), undefined, { timeout: 20_000 })
    .catch(() => undefined);
}

async function visitAll(role: Role) {
  const problems: string[] = [];
  const errors: string[] = [];
  const context = await browser.newContext({ viewport: { width: WIDTHS[0], height: 900 } });
  contexts.push(context);
  const page = await context.newPage();
  page.on("pageerror", (e) => errors.push(`${page.url()}: ${e.message}`));
  page.on("console", (m) => {
    // The browser's own line for an expected 403/404 is not an application error.
    if (m.type() === "error" && !m.text().startsWith("Failed to load resource"))
      errors.push(`${page.url()}: ${m.text()}`);
  });
  await page.goto(`${server.url}/sign-in`);
  await page.getByLabel("E-mail").waitFor();
  await picture(page, `${WIDTHS[0]}-sign-in`);
  await signIn(page, users[role]);
  for (const width of WIDTHS) {
    await page.setViewportSize({ width, height: width > 800 ? 900 : 844 });
    for (const screen of screens()) {
      await page.goto(`${server.url}${screen.url}`);
      await settle(page);
      const where = `${role} ${width}px ${screen.name}`;
      const fit = await page.evaluate(() => ({
        scroll: document.documentElement.scrollWidth,
        viewport: window.innerWidth,
      }));
      if (fit.scroll > fit.viewport)
        problems.push(`${where}: ${fit.scroll} px wide in a ${fit.viewport} px viewport (${await widest(page)})`);
      const text = await page.locator("body").innerText();
      const raw = text.match(RAW_VALIDATOR_TEXT);
      if (raw) problems.push(`${where}: raw validator text "${raw[0]}"`);
      const refused = await page.getByTestId("not-allowed").count();
      await picture(page, `${width}-${screen.name}${refused ? "-roped-off" : ""}`);
    }
  }
  return { problems, errors };
}

/** The outermost elements that stick out past the right edge, to name the culprit in the failure. */
const widest = (page: Page) =>
  page.evaluate(() => {
    const edge = window.innerWidth;
    const out: string[] = [];
    for (const el of Array.from(document.body.querySelectorAll<HTMLElement>("*"))) {
      if (el.getBoundingClientRect().right <= edge + 1) continue;
      const parent = el.parentElement;
      if (parent && parent !== document.body && parent.getBoundingClientRect().right > edge + 1) continue;
      out.push(`${el.tagName.toLowerCase()}.${String(el.className).split(" ").slice(0, 4).join(".")}`);
    }
    return out.slice(0, 3).join(", ");
  });

/** One picture per screen and width, whoever opens it first. */
async function picture(page: Page, name: string) {
  if (pictured.has(name)) return;
  pictured.add(name);
  const width = page.viewportSize()?.width ?? 1440;
  const height = await page.evaluate(() => document.documentElement.scrollHeight);
  await page.screenshot({
    path: path.join(SCREEN_DIR, `${name}.png`),
    animations: "disabled",
    // A whole-page picture of a long screen can take a while on a busy runner.
    timeout: 90_000,
    fullPage: true,
    ...(height > 4000 ? { clip: { x: 0, y: 0, width, height: 4000 } } : {}),
  });
}

describe("every route for every role, at 1440 px and 390 px", () => {
  it.each(ROLES)(
    "%s: every screen fits, shows no raw validator text and logs no console error",
    async (role) => {
      const { problems, errors } = await visitAll(role);
      expect(problems).toEqual([]);
      expect(errors).toEqual([]);
    },
    900_000,
  );
});
