import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { launchBrowser, screenshot, requireBuiltClient, downloadedText } from "../setup/browser";
import { makeTestApp } from "../setup/app";
import { createPlan, createProfile, twoStageRevision } from "../setup/plans";
import type { Agent } from "../setup/app";
import { signedInPages } from "../setup/signed-in";
import { startTestServer } from "../setup/server";
import { createTestUser, type TestUser } from "../setup/users";
import { testDb } from "../setup/db";
import { deliverDueMail } from "../../server/mailer/outbox";
import { startMailSink, type MailSink } from "../../server/mailer/sink";

// The browser clicks through the real built client served by the real app; only the model profile is made through the API.
const PLAN_MAIL = ["plan.review_requested", "plan.changes_requested", "plan.approved", "plan.ready"];

let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Browser;
let sink: MailSink;
let researcher: TestUser;
let approverA: TestUser;
let approverB: TestUser;
let admin: TestUser;
let otherOwner: TestUser;
let profile: { id: number; name: string };
let api: Agent;
const title = `Gannet to 32k ${Date.now().toString(36)}`;
let planId = 0;
let signedHash = "";
const { signedIn, closeAll, errors } = signedInPages(
  () => browser,
  () => server.url,
  { width: 1280 },
);

beforeAll(async () => {
  requireBuiltClient();
  [server, browser, sink, researcher, approverA, approverB, admin, otherOwner] = await Promise.all([
    startTestServer(),
    launchBrowser(),
    startMailSink({ db: testDb().db, port: 0 }),
    createTestUser(["researcher"], "Rhea Researcher"),
    createTestUser(["approver"], "Abel Approver"),
    createTestUser(["approver"], "Bea Approver"),
    createTestUser(["admin"], "Ada Admin"),
    createTestUser(["researcher"], `Otto Owner ${Date.now().toString(36)}`),
  ]);
  // Sample profile (tests/fixtures/profiles.ts): 128-dim heads, base 10 000, trained on 4096 tokens.
  api = await makeTestApp().agentAs(["researcher"]);
  profile = await createProfile(api);
  // Someone else's plan, never on the filtered page, so the owner filter must learn of Otto from the server.
  await createPlan(await makeTestApp().signIn(otherOwner), profile.id, { title: `Osprey ${Date.now().toString(36)}` });
});

afterAll(async () => {
  await closeAll();
  await browser?.close();
  await sink?.close();
  await server?.close();
});

const stage = (page: Page, n: number) => page.getByRole("group", { name: `Stage ${n}`, exact: true });

async function approveFromQueue(who: TestUser, expectNotice: string) {
  const page = await signedIn(who, "/review");
  await page.getByRole("heading", { level: 1, name: "Inspection" }).waitFor();
  await page.getByRole("button", { name: `Inspect ${title} revision 1` }).click();
  const dialog = page.getByRole("dialog");
  await dialog.waitFor();
  // The dialog names the exact hash the decision signs: the one the plan page showed.
  expect(await dialog.getByTestId("hash-to-sign").textContent()).toBe(signedHash);
  await screenshot(page, "plans-decision-dialog");
  await dialog.getByLabel("Note (optional)").fill(`Checked by ${who.name}.`);
  await dialog.getByRole("button", { name: "Sign and pass" }).click();
  await page.getByText(expectNotice).waitFor();
  await dialog.waitFor({ state: "detached" });
  return page;
}

describe("plan workflow in a browser", () => {
  it("a researcher drafts a two-stage plan through the form and submits it", async () => {
    const page = await signedIn(researcher, "/plans");
    await page.getByRole("heading", { level: 1, name: "Plans" }).waitFor();
    await page.getByRole("link", { name: "New plan" }).click();
    const form = page.getByRole("form", { name: "New plan" });
    await form.waitFor();

    // The shared schema speaks before the server is asked.
    await form.getByRole("button", { name: "Save draft" }).click();
    await form.getByText("Title is required.").waitFor();

    await form.getByLabel("Title").fill(title);
    // The picker offers one page of profiles; its search finds this one wherever it sorts.
    await page.getByLabel("Find a model profile").fill(profile.name);
    await form.getByLabel("Model", { exact: true }).selectOption({ label: profile.name });
    await form.getByLabel("Purpose").fill("Long documents for the support assistant");
    await form.getByLabel("Passes required").selectOption("2");
    await form.getByLabel("Method", { exact: true }).selectOption("yarn");

    // A target inside the trained window passes the form's own schema; the server's model check names the field.
    const target = form.getByLabel("Target context (tokens)").first();
    await target.fill("2048");
    await form.getByRole("button", { name: "Save draft" }).click();
    await expect.poll(() => target.getAttribute("aria-invalid")).toBe("true");
    // The message is the one wired to that input (the live check above may say the same in its own box).
    const errorId = (await target.getAttribute("aria-describedby"))?.split(" ").find((id) => id.endsWith("-error"));
    expect(await page.locator(`[id="${errorId}"]`).textContent()).toMatch(
      /must exceed the trained context \(4096\) for method yarn/,
    );
    await target.fill("32768");

    // The live check answers for 4096 → 32768 (s = 8) before anything is saved.
    const live = page.getByTestId("live-flags");
    await live.waitFor();
    await expect.poll(() => live.textContent()).toContain("×8 the trained window");

    await form.getByRole("button", { name: "Add stage" }).click();
    await form.getByRole("button", { name: "Add stage" }).click();
    await stage(page, 1).getByLabel("Target context (tokens)").fill("16384");
    await stage(page, 1).getByLabel("Sequence length (tokens)").fill("16384");
    await stage(page, 1).getByLabel("Steps").fill("200");
    await stage(page, 1).getByLabel("Data mix").fill("books 60%, code 40%");
    await stage(page, 2).getByLabel("Steps").fill("200");
    await stage(page, 2).getByLabel("Global batch (sequences)").fill("32");
    // 200 steps × 32 sequences × 32 768 tokens, shown beside the stage as it is typed.
    await stage(page, 2).getByText("Tokens trained: 210 million").waitFor();
    await form.getByRole("button", { name: "Add acceptance criterion" }).click();
    await page.getByRole("group", { name: "Criterion 1" }).getByLabel("Evaluation").fill("passkey retrieval");

    await screenshot(page, "plans-new-form");
    await form.getByRole("button", { name: "Save draft" }).click();
    await page.waitForURL(/\/plans\/\d+$/);
    planId = Number(new URL(page.url()).pathname.split("/").pop());
    await page.getByRole("heading", { level: 1, name: title }).waitFor();
    const view = page.getByTestId("revision-view");
    await view.getByRole("table", { name: "Stages" }).waitFor();
    await expect(view.getByRole("table", { name: "Stages" }).locator("tbody tr").count()).resolves.toBe(2);
    await expect
      .poll(() => page.getByText("Passes needed").locator("xpath=following-sibling::dd[1]").textContent(), {
        timeout: 15_000,
      })
      .toContain("2");

    await page.getByRole("button", { name: "Send to inspection" }).click();
    await page
      .getByRole("group", { name: "Revision actions" })
      .getByRole("button", { name: "Take back to the walk" })
      .waitFor();
    await expect.poll(() => page.getByRole("list", { name: "Revisions" }).textContent()).toContain("At inspection");
    signedHash = (await page.getByTestId("content-hash").textContent()) ?? "";
    expect(signedHash).toMatch(/^[0-9a-f]{64}$/);
    await page.getByTestId("verify-status").and(page.locator('[data-ok="true"]')).waitFor();
    await page.getByTestId("revision-charts").locator("svg").first().waitFor();
    await screenshot(page, "plans-plan-in-review");

    // The list: filters and sort live in the URL and are applied by the server.
    await page.goto(`${server.url}/plans`);
    const plans = page.getByRole("table", { name: "Plans" });
    await plans.getByRole("link", { name: title }).waitFor();
    await screenshot(page, "plans-list");
    await page.getByLabel("Search plans").fill(title);
    await page.waitForURL((u) => u.searchParams.get("q") === title);
    await page.getByLabel("State").selectOption("approved");
    await page.waitForURL((u) => u.searchParams.get("state") === "approved");
    await plans.getByText("No plans match these filters.").waitFor();
    await page.getByLabel("State").selectOption("in_review");
    await plans.getByRole("link", { name: title }).waitFor();
    // The owner filter lists every plan owner (GET /api/plans/owners), not only those on this page.
    const owner = page.getByLabel("Owner", { exact: true });
    await expect.poll(() => owner.locator("option").allTextContents()).toContain(otherOwner.name);
    await owner.selectOption({ label: otherOwner.name });
    await page.waitForURL((u) => u.searchParams.get("ownerId") === String(otherOwner.id));
    await plans.getByText("No plans match these filters.").waitFor();
    await owner.selectOption({ label: `${researcher.name} (you)` });
    await page.waitForURL((u) => u.searchParams.get("ownerId") === String(researcher.id));
    await plans.getByRole("link", { name: title }).waitFor();
    await plans.getByRole("button", { name: "Plan" }).click();
    await page.waitForURL((u) => u.searchParams.get("sort") === "title" && u.searchParams.get("dir") === "asc");
    await plans.locator('th[aria-sort="ascending"]', { hasText: "Plan" }).waitFor();
    // The header follows the URL at once; the rows follow the server's answer to the new order.
    await expect.poll(() => plans.locator("tbody tr").count()).toBe(1);
  }, 90_000);

  // Defect (issue 15): the review page at 390 px was 647 px wide.
  it("the inspection bench and the decision dialog fit a 390 px screen", async () => {
    const page = await signedIn(approverA, "/review", 390);
    const open = page.getByRole("button", { name: `Inspect ${title} revision 1` });
    await open.waitFor();
    const width = () => page.evaluate(() => document.documentElement.scrollWidth);
    expect(await width()).toBeLessThanOrEqual(390);
    await screenshot(page, "review-390");
    await open.click();
    const dialog = page.getByRole("dialog");
    await dialog.getByTestId("hash-to-sign").waitFor();
    await dialog.getByRole("radio", { name: /Send back to the walk/ }).check();
    await dialog.getByRole("button", { name: "Sign and send back" }).click();
    // Sending back needs a note; nothing is recorded without one.
    await dialog.getByText("Say what to re-lay before sending it back.").waitFor();
    expect(await width()).toBeLessThanOrEqual(390);
    expect(await dialog.evaluate((d) => d.scrollWidth <= d.clientWidth)).toBe(true);
    await screenshot(page, "review-dialog-390");
    await dialog.getByRole("button", { name: "Cancel" }).click();
    await dialog.waitFor({ state: "detached" });
  }, 60_000);

  it("two approvers pass it from the inspection bench; the plan is passed", async () => {
    expect(planId).toBeGreaterThan(0);
    await approveFromQueue(approverA, "passed by you; it waits for more inspectors");
    // The second approver decides from the plan page itself.
    const page = await signedIn(approverB, `/plans/${planId}`);
    await page.getByRole("button", { name: "Inspect revision 1" }).click();
    const dialog = page.getByRole("dialog");
    expect(await dialog.getByTestId("hash-to-sign").textContent()).toBe(signedHash);
    await expect.poll(() => dialog.textContent()).toContain("So far 1 of 2 passes");
    await dialog.getByLabel("Note (optional)").fill(`Checked by ${approverB.name}.`);
    await dialog.getByRole("button", { name: "Sign and pass" }).click();
    await page.getByText("Revision 1 passed inspection and is signed.").waitFor();
    await expect.poll(() => page.getByRole("list", { name: "Revisions" }).textContent()).toContain("Passed");
    // Decided revisions leave the queue.
    await page.goto(`${server.url}/review`);
    await page.getByRole("table", { name: "Inspection bench" }).waitFor();
    await expect(page.getByRole("button", { name: `Inspect ${title} revision 1` }).count()).resolves.toBe(0);
  }, 60_000);

  it("the researcher sees Passed and downloads the export and the report", async () => {
    const page = await signedIn(researcher, `/plans/${planId}`);
    await page.getByRole("heading", { level: 1, name: title }).waitFor();
    await expect.poll(() => page.getByRole("list", { name: "Revisions" }).textContent()).toContain("Passed");
    await page.getByTestId("verify-status").and(page.locator('[data-ok="true"]')).waitFor();
    // The decisions come with the plan's query, not with the check waited for above: wait for both, not a read at once.
    await expect
      .poll(() => page.getByRole("list", { name: "Decisions" }).getByTestId("signed-hash").allTextContents(), {
        timeout: 15_000,
      })
      .toEqual([signedHash, signedHash]);
    // Each decision says that the server's signature on it holds.
    const seals = page.getByRole("list", { name: "Decisions" }).getByTestId("signature-status");
    await expect
      .poll(() => seals.evaluateAll((els) => els.map((e) => e.getAttribute("data-status"))))
      .toEqual(["valid", "valid"]);
    await expect.poll(() => seals.first().textContent()).toMatch(/Server signature holds · key [0-9a-f]/);
    await screenshot(page, "plans-plan-approved");

    const [exported] = await Promise.all([
      page.waitForEvent("download"),
      page.getByRole("link", { name: "Download export (config patch JSON)" }).click(),
    ]);
    const envelope = JSON.parse(await downloadedText(exported));
    expect(envelope.config.rope_scaling.rope_type).toBe("yarn");
    // YaRN with the default factor: target ÷ trained = 32768 ÷ 4096.
    expect(envelope.config.rope_scaling.factor).toBe(8);
    expect(envelope.config.rope_scaling.original_max_position_embeddings).toBe(4096);
    expect(envelope.contentHash).toBe(signedHash);
    expect(envelope.signedBy.map((s: { name: string }) => s.name).sort()).toEqual(["Abel Approver", "Bea Approver"]);

    const [report] = await Promise.all([
      page.waitForEvent("download"),
      page.getByRole("link", { name: "Download report" }).click(),
    ]);
    const html = await downloadedText(report);
    expect(html).toContain(title);
    expect(html.split(signedHash).length - 1).toBeGreaterThanOrEqual(2);
  }, 60_000);

  it("a new revision is edited (a stale save is refused plainly) and compared with the signed one", async () => {
    const page = await signedIn(researcher, `/plans/${planId}`);
    await page.getByRole("button", { name: "Start new revision" }).click();
    await page.waitForURL(new RegExp(`/plans/${planId}/revisions/2/edit$`));
    const form = page.getByRole("form", { name: "Edit revision 2" });
    await form.waitFor();

    // A second tab reads the same draft, then the first one saves: the second's version is now stale.
    const other = await page.context().newPage();
    await other.goto(`${server.url}/plans/${planId}/revisions/2/edit`);
    const otherForm = other.getByRole("form", { name: "Edit revision 2" });
    await otherForm.waitFor();

    await stage(page, 2).getByLabel("Steps").fill("300");
    await form.getByLabel("Notes for inspectors").fill("Longer second stage after the first review.");
    await form.getByRole("button", { name: "Save draft" }).click();
    await page.getByText("Saved as version 2").waitFor();

    await otherForm.getByLabel("Notes for inspectors").fill("A competing edit.");
    await otherForm.getByRole("button", { name: "Save draft" }).click();
    await other.getByText("Changed since you read it — reload").waitFor();
    await other.getByRole("button", { name: "Reload the saved draft" }).click();
    await other.waitForFunction(() =>
      (document.querySelector("textarea") as HTMLTextAreaElement | null)?.value.startsWith("Longer second stage"),
    );
    await other.close();

    await page.goto(`${server.url}/plans/${planId}?revision=2`);
    await page.getByRole("link", { name: "Lay revisions side by side" }).click();
    await page.waitForURL(new RegExp(`/plans/${planId}/diff\\?a=1&b=2$`));
    const stages = page.getByRole("region", { name: "Changed stages" });
    await stages.getByText("Stage 2: 1 field changed").waitFor();
    // Was 200, now 300 steps: +100 and ×1.5 (300 ÷ 200).
    await expect(stages.getByRole("table", { name: "Stage 2 changes" }).textContent()).resolves.toMatch(
      /steps.*200.*300.*\+100 · ×1\.5/,
    );
    await expect.poll(() => page.getByRole("region", { name: "Changed fields" }).textContent()).toContain("notes");
    await screenshot(page, "plans-diff");
  }, 150_000);

  it("an approver reads the plan's audit trail", async () => {
    const page = await signedIn(approverA, `/audit?subjectType=plan&subjectId=${planId}`);
    const table = page.getByRole("table", { name: "Audit trail" });
    await table.getByText("revision.approved").waitFor();
    const actions = await table.locator("tbody tr td:nth-child(3) [data-code]").allTextContents();
    for (const a of [
      "plan.created",
      "revision.submitted",
      "decision.approved",
      "revision.approved",
      "revision.exported",
      "revision.created",
      "revision.edited",
    ]) {
      expect(actions).toContain(a);
    }
    expect(actions.filter((a) => a === "decision.approved")).toHaveLength(2);
    // Workflow codes also read in the review words (docs/review-words.md); the code stays beside them.
    const passed = table.locator("tbody tr td:nth-child(3)", { hasText: "revision.approved" });
    await expect(passed.first().textContent()).resolves.toContain("Passed");
    // The editor sends only what was edited, so the trail names exactly those fields.
    const edited = await table.locator("tbody tr", { hasText: "revision.edited" }).textContent();
    expect(edited).toContain('["stages","notes"]');
    await screenshot(page, "plans-audit");
  }, 60_000);

  it("an admin sees the workflow's mail after delivery", async () => {
    // Delivered here to this file's sink (plan kinds only, so other files' test mail is left alone).
    const deps = {
      db: testDb().db,
      config: { smtpUrl: `smtp://127.0.0.1:${sink.port}`, mailFrom: "ropewalk@ropewalk.test", mailRetryBaseMs: 0 },
    };
    await deliverDueMail(deps, { kinds: PLAN_MAIL, limit: 5000 });
    const page = await signedIn(admin, "/mail");
    await page.getByLabel("Search mail").fill(title);
    const received = page.getByRole("list", { name: "Received messages" });
    await received.getByText(approverA.email, { exact: false }).first().waitFor();
    // For inspection (to the approvers) and passed (to the author); "ready" goes to infra leads, if any.
    // The search is debounced and the list keeps the unsearched messages until it answers: wait for both subjects.
    const subjects = received.getByTestId("subject");
    await expect.poll(() => subjects.allTextContents()).toContain(`For inspection: "${title}" rev. 1, round 1`);
    await expect.poll(() => subjects.allTextContents()).toContain(`Passed: "${title}" rev. 1`);
    // The plan's own line: what was sent, in order, each delivered.
    const line = page.getByRole("list", { name: "Deliveries by plan" }).getByRole("listitem", { name: title });
    await line.getByTestId("kind").filter({ hasText: "Told the author it passed" }).first().waitFor();
    const kinds = await line.getByTestId("kind").allTextContents();
    expect(kinds.indexOf("Asked the inspectors")).toBeGreaterThanOrEqual(0);
    expect(kinds.indexOf("Asked the inspectors")).toBeLessThan(kinds.indexOf("Told the author it passed"));
    // The body opens in place.
    await line.getByText(`Passed: "${title}" rev. 1`).click();
    await expect.poll(() => line.textContent()).toContain(`/plans/${planId}`);
    await screenshot(page, "plans-mail");
  }, 60_000);

  it("a researcher makes an API token, reads the signed export with it, and revokes it", async () => {
    const page = await signedIn(researcher, "/profile");
    const form = page.getByRole("form", { name: "New API token" });
    await form.getByLabel("Token name").fill("cluster export");
    // The one scope today is offered and ticked by default; the table shows it on the new row.
    expect(await form.getByRole("checkbox", { name: /export:read/ }).isChecked()).toBe(true);
    await form.getByRole("button", { name: "Create token" }).click();
    const secret = (await page.getByTestId("new-token-secret").textContent()) ?? "";
    expect(secret).toMatch(/^rw_/);
    const table = page.getByRole("table", { name: "API tokens" });
    await table.getByText("cluster export").waitFor();
    expect(await table.locator("tbody tr").first().textContent()).toContain("export:read");
    await screenshot(page, "plans-tokens");

    const withToken = () =>
      fetch(`${server.url}/api/plans/${planId}/approved/export`, { headers: { Authorization: `Bearer ${secret}` } });
    const ok = await withToken();
    expect(ok.status).toBe(200);
    expect((await ok.json()).config.rope_scaling.rope_type).toBe("yarn");

    await page.getByRole("button", { name: "I have stored it" }).click();
    await page.getByTestId("new-token-secret").waitFor({ state: "detached" });
    await expect(page.getByTestId("new-token-secret").count()).resolves.toBe(0);
    await page.getByRole("button", { name: "Revoke cluster export" }).click();
    await page.getByText("cluster export is revoked").waitFor();
    await expect.poll(() => table.locator("tbody tr").first().textContent()).toContain("Revoked");
    expect((await withToken()).status).toBe(401);
  }, 60_000);

  it("a plan with a budget sheet shows its frozen per-stage figures", async () => {
    // An invented cluster given inline: 1 PFLOP/s peak, 80 GiB, 2.5 per accelerator-hour, 64 of them.
    const budget = { cluster: { peakFlops: 1e15, memoryBytes: 80 * 2 ** 30, pricePerHour: 2.5 }, accelerators: 64 };
    const plan = await createPlan(api, profile.id, {
      title: `${title} costed`,
      revision: { ...twoStageRevision(), budget },
    });
    const page = await signedIn(approverA, `/plans/${plan.id}`);
    const panel = page.getByTestId("budget-panel");
    await panel.waitFor();
    const rows = panel.getByRole("table", { name: "Budget per stage" }).locator("tbody tr");
    await expect.poll(() => rows.count()).toBe(2);
    // Tokens = steps × global batch × sequence length: 200 × 64 × 16 384 and 200 × 32 × 32 768, 419 430 400 in all.
    await expect(rows.nth(0).locator("td").first().textContent()).resolves.toBe("210 million");
    await expect(panel.locator("tfoot td").first().textContent()).resolves.toBe("419 million");
    await expect.poll(() => panel.textContent()).toContain("64 × custom accelerator");
    await screenshot(page, "plans-budget");
  }, 60_000);

  it("a revision whose stored content was altered is flagged, and its export is not offered", async () => {
    // Tampering behind the application's back: the stored hash no longer matches the content.
    await testDb().pool.query(
      `UPDATE plan_revisions SET content = jsonb_set(content, '{notes}', '"edited in the database"') WHERE plan_id = $1 AND number = 1`,
      [planId],
    );
    const page = await signedIn(researcher, `/plans/${planId}?revision=1`);
    const status = page.getByTestId("verify-status");
    await status.and(page.locator('[data-ok="false"]')).waitFor();
    await expect.poll(() => status.textContent()).toContain("Integrity failure");
    await expect
      .poll(() => page.getByRole("button", { name: "Download export (config patch JSON)" }).isDisabled(), {
        timeout: 15_000,
      })
      .toBe(true);
    await expect(page.getByRole("link", { name: "Download export (config patch JSON)" }).count()).resolves.toBe(0);
    await screenshot(page, "plans-integrity-failure");
  }, 60_000);

  it("the plans list reads by cursor both ways: Next page follows nextAfter, Previous page prevBefore", async () => {
    const model = await createProfile(api);
    const tag = `Tern ${Date.now().toString(36)}`;
    for (let i = 0; i < 5; i++) await createPlan(api, model.id, { title: `${tag} ${i}` });
    const page = await signedIn(researcher, `/plans?modelId=${model.id}&pageSize=2&sort=title&dir=asc`);
    const table = page.getByRole("table", { name: "Plans" });
    const titles = async (expected: string[]) => {
      await table.getByText(expected[0]!, { exact: true }).waitFor();
      await expect
        .poll(async () => (await table.locator("tbody tr td:first-child a").allTextContents()).map((t) => t.trim()))
        .toEqual(expected);
    };
    const pager = page.getByRole("navigation", { name: "Plans pages" });
    await titles([`${tag} 0`, `${tag} 1`]);
    await pager.getByRole("button", { name: "Next page" }).click();
    await titles([`${tag} 2`, `${tag} 3`]);
    // The second page was asked by cursor (page only labels it).
    const second = new URL(page.url()).searchParams;
    expect(second.get("page")).toBe("2");
    expect(second.get("after")).toMatch(/^[A-Za-z0-9_-]+$/);
    await pager.getByRole("button", { name: "Next page" }).click();
    await titles([`${tag} 4`]);
    expect(new URL(page.url()).searchParams.get("after")).not.toBe(second.get("after"));
    // The previous page is asked of the server by cursor too, read backwards from the shown page's first plan.
    const asked = page.waitForRequest((r) => r.url().includes("/api/plans?") && r.url().includes("before="));
    await pager.getByRole("button", { name: "Previous page" }).click();
    expect(new URL((await asked).url()).searchParams.get("after")).toBeNull();
    await titles([`${tag} 2`, `${tag} 3`]);
    const back = new URL(page.url()).searchParams;
    expect([back.get("page"), back.get("after")]).toEqual(["2", null]);
    expect(back.get("before")).toMatch(/^[A-Za-z0-9_-]+$/);
    // Page 1 is the top of the list: no cursor.
    await pager.getByRole("button", { name: "Previous page" }).click();
    await titles([`${tag} 0`, `${tag} 1`]);
    const top = new URL(page.url()).searchParams;
    expect([top.get("page"), top.get("after"), top.get("before")]).toEqual(["1", null, null]);
    await pager.getByRole("button", { name: "Next page" }).click();
    await titles([`${tag} 2`, `${tag} 3`]);
    // A new order starts again from page 1 and drops the cursor read under the old one.
    await pager.getByRole("button", { name: "Next page" }).click();
    await titles([`${tag} 4`]);
    await table.getByRole("columnheader", { name: /Plan/ }).getByRole("button").click();
    await titles([`${tag} 4`, `${tag} 3`]);
    const reordered = new URL(page.url()).searchParams;
    expect([reordered.get("dir"), reordered.get("page"), reordered.get("after"), reordered.get("before")]).toEqual([
      "desc",
      null,
      null,
      null,
    ]);
  }, 60_000);

  it("no page error or console error along the way", () => {
    expect(errors).toEqual([]);
  });
});
