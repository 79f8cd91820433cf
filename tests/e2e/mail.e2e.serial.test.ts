// Serial: it delivers every due row in the shared outbox, which would race other files' mail tests.
import crypto from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { launchBrowser, screenshot, requireBuiltClient } from "../setup/browser";
import { testConfig } from "../setup/app";
import { testDb } from "../setup/db";
import { signedInPages } from "../setup/signed-in";
import { startTestServer } from "../setup/server";
import { createTestUser, type TestUser } from "../setup/users";
import { deliverDueMail, enqueueMail } from "../../server/mailer/outbox";
import { startMailSink, type MailSink } from "../../server/mailer/sink";

const { pool, db } = testDb();
const tag = crypto.randomBytes(5).toString("hex");
const subject = `Sink check ${tag}`;
const to = `${tag}@example.test`;

let sink: MailSink;
let server: Awaited<ReturnType<typeof startTestServer>>;
let browser: Browser;
let admin: TestUser;
const { signedIn, closeAll, errors } = signedInPages(
  () => browser,
  () => server.url,
  { width: 1280 },
);

beforeAll(async () => {
  requireBuiltClient();
  sink = await startMailSink({ db, port: 0 });
  const overrides = { smtpUrl: `smtp://127.0.0.1:${sink.port}`, mailRetryBaseMs: 0 };
  [server, browser, admin] = await Promise.all([
    startTestServer(overrides),
    launchBrowser(),
    createTestUser(["admin"], "Ada Admin"),
  ]);
  // Other files leave pending rows; sent now, they cannot stand before this file's row in the button's batches.
  await deliverDueMail({ db, config: testConfig(overrides) }, { limit: 100_000 });
  await enqueueMail(db, {
    kind: `test.${tag}`,
    to: [to],
    subject,
    body: `Delivered by the Mail page's button (${tag}).`,
  });
});

afterAll(async () => {
  await closeAll();
  await browser?.close();
  await sink?.close();
  await server?.close();
});

const outboxRow = async () =>
  (await pool.query("SELECT status, attempts, sent_at FROM mail_outbox WHERE kind = $1", [`test.${tag}`])).rows;

describe("Mail page in a browser", () => {
  it("an admin delivers due mail now; the message reaches the sink and its outbox row is sent", async () => {
    expect(await outboxRow()).toMatchObject([{ status: "pending", attempts: 0, sent_at: null }]);
    const page = await signedIn(admin, "/mail");
    await page.getByRole("heading", { level: 1, name: "Mail" }).waitFor();
    // The search narrows both the deliveries and the received messages.
    await page.getByLabel("Search mail").fill(tag);
    const deliveries = page.getByRole("list", { name: "Deliveries by plan" });
    const statuses = () =>
      deliveries.locator("li[data-outbox-id]").evaluateAll((els) => els.map((e) => e.getAttribute("data-status")));
    await expect.poll(statuses).toEqual(["pending"]);
    // Mail about no plan sits on the "Other mail" line, its attempts inline.
    await deliveries.getByRole("listitem", { name: "Other mail" }).getByText("Waiting for its first try").waitFor();
    const received = page.getByRole("list", { name: "Received messages" });
    await page.getByText("No messages received.").waitFor();

    await page.getByRole("button", { name: "Deliver due mail now" }).click();
    // After the drain only this row (and any retry that fell due meanwhile) was due; none may fail.
    await page.getByText(/^Sent [1-9]\d*\.$/).waitFor();

    await received.getByText(subject).waitFor();
    await expect(received.getByTestId("subject").allTextContents()).resolves.toEqual([subject]);
    // The body opens in place.
    await received.getByText(subject).click();
    await received.getByText(`Delivered by the Mail page's button (${tag}).`).waitFor();
    await expect(received.textContent()).resolves.toContain(to);
    await expect.poll(statuses).toEqual(["sent"]);
    await expect(deliveries.getByTestId("attempts").textContent()).resolves.toMatch(/^Sent .* after 1 try$/);

    const [row] = await outboxRow();
    expect(row).toMatchObject({ status: "sent", attempts: 1 });
    expect(row.sent_at).toBeInstanceOf(Date);
    await screenshot(page, "mail-delivered");
  }, 60_000);

  it("no page error or console error along the way", () => {
    expect(errors).toEqual([]);
  });
});
