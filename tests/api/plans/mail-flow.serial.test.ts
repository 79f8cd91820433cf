// Serial: other files deliver every due row to their own sinks; alone, this file's sink sees its plan's mail.
import net from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { makeTestApp } from "../../setup/app";
import { testDb } from "../../setup/db";
import { createPlan, createProfile, decide, post, put } from "../../setup/plans";
import { deliverDueMail } from "../../../server/mailer/outbox";
import { startMailSink, type MailSink } from "../../../server/mailer/sink";

const { pool, db } = testDb();
const freePort = () =>
  new Promise<number>((resolve) => {
    const s = net.createServer().listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
let port: number;
let sink: MailSink | undefined;
let app: ReturnType<typeof makeTestApp>;
beforeAll(async () => {
  port = await freePort();
  app = makeTestApp({ smtpUrl: `smtp://127.0.0.1:${port}`, mailRetryBaseMs: 0 });
});
afterAll(async () => sink?.close());

const received = async (address: string, subjectPart: string) =>
  (
    await pool.query("SELECT subject, text FROM mail_sink_messages WHERE $1 = ANY(to_addresses) AND subject LIKE $2", [
      address,
      `%${subjectPart}%`,
    ])
  ).rows;

describe("plan workflow mail through the local SMTP sink", () => {
  it("sink down during submit: the submit commits, the mail arrives once after the sink returns; every message type is sent", async () => {
    const { agentAs } = app;
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    const infra = await agentAs(["infra"]);
    const model = await createProfile(researcher);
    const plan = await createPlan(researcher, model.id, { title: `Mail flow ${Date.now()}` });
    const base = `/api/plans/${plan.id}/revisions/1`;

    // No sink listening: the state change still commits.
    await post(researcher, `${base}/submit`).expect(200);
    const down = await deliverDueMail(app.deps, { limit: 5000 });
    expect(down.sent).toBe(0);
    const pending = await pool.query(
      "SELECT status, attempts, last_error FROM mail_outbox WHERE kind = 'plan.review_requested' AND $1 = ANY(to_addresses)",
      [approver.user!.email],
    );
    expect(pending.rows).toHaveLength(1);
    expect(pending.rows[0]).toMatchObject({ status: "pending", attempts: 1 });
    expect(pending.rows[0].last_error).toBeTruthy();

    sink = await startMailSink({ db, port });
    await deliverDueMail(app.deps, { limit: 5000 });
    await deliverDueMail(app.deps, { limit: 5000 });
    const review = await received(approver.user!.email, "");
    expect(review.filter((m) => m.text.includes(`/plans/${plan.id}`))).toHaveLength(1);

    // Changes requested → author; then a new revision approved → author and infra.
    await decide(approver, `${base}/decisions`, { decision: "request_changes", comment: "raise stage 1 batch" }).expect(
      200,
    );
    await post(researcher, `/api/plans/${plan.id}/revisions`).expect(201);
    // Content sent back cannot return unchanged, so the author does what was asked.
    await put(researcher, `/api/plans/${plan.id}/revisions/2`, { version: 1, notes: "stage 1 batch raised" }).expect(
      200,
    );
    await post(researcher, `/api/plans/${plan.id}/revisions/2/submit`).expect(200);
    await decide(approver, `/api/plans/${plan.id}/revisions/2/decisions`, { decision: "approve" }).expect(200);
    await deliverDueMail(app.deps, { limit: 5000 });
    const toAuthor = (await received(researcher.user!.email, "")).filter((m) => m.text.includes(`/plans/${plan.id}`));
    expect(toAuthor).toHaveLength(2);
    expect(toAuthor.some((m) => m.text.includes("raise stage 1 batch"))).toBe(true);
    const toInfra = (await received(infra.user!.email, "")).filter((m) => m.text.includes(`/plans/${plan.id}`));
    expect(toInfra).toHaveLength(1);
    expect(toInfra[0].text.replace(/\s+/g, " ")).toMatch(/long-context evaluations of the tuned model/i);
    // Nothing is sent twice.
    await deliverDueMail(app.deps, { limit: 5000 });
    expect((await received(approver.user!.email, "")).filter((m) => m.text.includes(`/plans/${plan.id}`))).toHaveLength(
      2,
    ); // review of r1 and r2
  });

  // Defects (issue 15): a resubmission's mail had the same subject as the first one, and withdrawing sent nothing
  // to the approvers who had been asked.
  it("resubmitting numbers the round in the subject; withdrawing tells the approvers who were asked, and only them", async () => {
    const { agentAs } = app;
    sink ??= await startMailSink({ db, port });
    const researcher = await agentAs(["researcher"]);
    const asked = await agentAs(["approver"]);
    const title = `Rounds ${Date.now()}`;
    const plan = await createPlan(researcher, (await createProfile(researcher)).id, { title });
    const base = `/api/plans/${plan.id}/revisions/1`;
    await post(researcher, `${base}/submit`).expect(200);
    // An approver who joins after the submission was not asked, so the withdrawal is not theirs to hear about.
    const late = await agentAs(["approver"]);
    await post(researcher, `${base}/withdraw`).expect(200);
    await post(researcher, `${base}/submit`).expect(200);
    await deliverDueMail(app.deps, { limit: 5000 });

    const mine = async (address: string) => (await received(address, title)).map((m) => m.subject as string).sort();
    expect(await mine(asked.user!.email)).toEqual([
      `For inspection: "${title}" rev. 1, round 1`,
      `For inspection: "${title}" rev. 1, round 2`,
      `Taken back from inspection: "${title}" rev. 1, round 1`,
    ]);
    expect(await mine(late.user!.email)).toEqual([`For inspection: "${title}" rev. 1, round 2`]);
    expect(await mine(researcher.user!.email)).toEqual([]);
    const [withdrawn] = await received(asked.user!.email, "Taken back");
    expect(withdrawn.text).toContain(`/plans/${plan.id}?revision=1`);
    expect(withdrawn.text).toContain("nothing is waiting for your decision");
    const again = (await received(asked.user!.email, "round 2"))[0];
    expect(again.text).toContain("This is round 2 of this revision");
  });
});
