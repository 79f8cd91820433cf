// Real SMTP conversations: nodemailer in the outbox talks to our smtp-server sink on loopback,
// and both sides are checked in PostgreSQL. The database is shared with other test files, so each
// test tags its rows (kind, recipients, subject) and delivers only its own kinds.
import crypto from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { makeTestApp } from "../setup/app";
import { testDb } from "../setup/db";
import { deliverDueMail, enqueueMail, outboxMessageId } from "../../server/mailer/outbox";
import { startMailSink, type MailSink } from "../../server/mailer/sink";
import { startOutboxWorker, type WorkerClock } from "../../server/mailer/worker";
import { approvedMail, changesRequestedMail, planReadyMail, reviewRequestedMail } from "../../server/mailer/messages";
import type { AppDeps } from "../../server/deps";
import { createPlan, createProfile, post } from "../setup/plans";

const { pool, db } = testDb();
let sink: MailSink;
let app: ReturnType<typeof makeTestApp>;

beforeAll(async () => {
  sink = await startMailSink({ db, port: 0 });
  app = makeTestApp({ smtpUrl: `smtp://127.0.0.1:${sink.port}`, mailRetryBaseMs: 0 });
});
afterAll(() => sink.close());

const tagged = () => {
  const tag = crypto.randomBytes(5).toString("hex");
  return { tag, kind: `test.${tag}`, to: [`${tag}-a@example.test`, `${tag}-b@example.test`] };
};
/** Sends everything already due (other files' plan mail included) to this file's sink. */
const drain = () => deliverDueMail(app.deps, { limit: 100_000 });
const depsFor = (smtpUrl: string, extra: Partial<AppDeps["config"]> = {}): AppDeps => ({
  ...app.deps,
  config: { ...app.deps.config, smtpUrl, ...extra },
});
const outboxRows = async (kind: string) =>
  (
    await pool.query(
      "SELECT id, status, attempts, last_error, sent_at, next_attempt_at, now() AS db_now FROM mail_outbox WHERE kind = $1 ORDER BY id",
      [kind],
    )
  ).rows;
const sinkFor = async (address: string) =>
  (
    await pool.query(
      "SELECT message_id, from_address, to_addresses, subject, text FROM mail_sink_messages WHERE $1 = ANY(to_addresses) ORDER BY id",
      [address],
    )
  ).rows;

describe("outbox delivery through the local sink", () => {
  it("delivers an enqueued message: the sink holds exactly it, the row is sent", async () => {
    const { tag, kind, to } = tagged();
    await enqueueMail(db, { kind, to, subject: `Subject ${tag}`, body: `Line one ${tag}\nLine two` });
    expect(await deliverDueMail(app.deps, { kinds: [kind] })).toEqual({ sent: 1, failed: 0 });

    const [row] = await outboxRows(kind);
    expect(row).toMatchObject({ status: "sent", attempts: 1 });
    expect(row.sent_at).toBeInstanceOf(Date);
    const got = await sinkFor(to[0]);
    expect(got).toHaveLength(1);
    expect(got[0]).toMatchObject({
      message_id: outboxMessageId(row.id),
      from_address: "ropewalk@ropewalk.test",
      to_addresses: to,
      subject: `Subject ${tag}`,
    });
    expect(got[0].text.trim()).toBe(`Line one ${tag}\nLine two`);
  });

  it("writes nothing for an empty recipient list, and rolls back with the caller's transaction", async () => {
    const { kind, to } = tagged();
    await enqueueMail(db, { kind, to: [], subject: "nobody", body: "x" });
    await expect(
      db.transaction(async (tx) => {
        await enqueueMail(tx, { kind, to, subject: "rolled back", body: "x" });
        throw new Error("the state change failed");
      }),
    ).rejects.toThrow("the state change failed");
    expect(await outboxRows(kind)).toEqual([]);
  });

  it("delivers each of the four plan messages with its link and hash", async () => {
    const { tag, to } = tagged();
    const input = {
      planId: 7,
      planTitle: `Plan ${tag}`,
      revision: 3,
      actorName: "Ines Okafor",
      comment: "Check the 128k bound.",
      contentHash: "ab".repeat(32),
      url: `http://127.0.0.1:3000/plans/7?t=${tag}`,
    };
    const built = [reviewRequestedMail(input), changesRequestedMail(input), approvedMail(input), planReadyMail(input)];
    // Tagged kinds keep this test's rows apart from the plan mail other files queue meanwhile.
    for (const m of built) await enqueueMail(db, { ...m, kind: `${m.kind}.${tag}`, to: [to[0]] });
    const r = await deliverDueMail(app.deps, { kinds: built.map((m) => `${m.kind}.${tag}`) });
    expect(r.sent).toBe(4);

    const got = await sinkFor(to[0]);
    expect(got.map((g) => g.subject)).toEqual(built.map((m) => m.subject));
    for (const g of got) {
      expect(g.text).toContain(input.url);
      expect(g.text).toContain(input.contentHash);
    }
    expect(got[3].text).toMatch(/signed configuration patch/);
    expect(got[3].text).toMatch(/long-context\s+evaluations of the tuned model/);
  });

  it("keeps a message when the server is down and delivers it exactly once when it is back", async () => {
    const own = await startMailSink({ db, port: 0 });
    const deps = depsFor(`smtp://127.0.0.1:${own.port}`);
    const { tag, kind, to } = tagged();
    await enqueueMail(db, { kind, to, subject: `Retry ${tag}`, body: "kept" });
    await own.close();

    expect(await deliverDueMail(deps, { kinds: [kind] })).toEqual({ sent: 0, failed: 1 });
    const [waiting] = await outboxRows(kind);
    expect(waiting).toMatchObject({ status: "pending", attempts: 1 });
    expect(waiting.last_error).toMatch(/ECONNREFUSED|connect/i);
    expect(await sinkFor(to[0])).toHaveLength(0);

    const again = await startMailSink({ db, port: own.port });
    try {
      expect(await deliverDueMail(deps, { kinds: [kind] })).toEqual({ sent: 1, failed: 0 });
      expect(await deliverDueMail(deps, { kinds: [kind] })).toEqual({ sent: 0, failed: 0 });
    } finally {
      await again.close();
    }
    expect(await sinkFor(to[0])).toHaveLength(1);
    expect((await outboxRows(kind))[0]).toMatchObject({ status: "sent", attempts: 2 });
  });

  it("waits base·2^attempts before retrying, and gives up after 20 attempts", async () => {
    const closed = await startMailSink({ db, port: 0 });
    await closed.close(); // a port nobody listens on
    const deps = depsFor(`smtp://127.0.0.1:${closed.port}`, { mailRetryBaseMs: 60_000 });
    const { kind, to } = tagged();
    await enqueueMail(db, { kind, to, subject: "backoff", body: "x" });
    await pool.query("UPDATE mail_outbox SET attempts = 2 WHERE kind = $1", [kind]);

    await deliverDueMail(deps, { kinds: [kind] });
    const [row] = await outboxRows(kind);
    // Third attempt failed after two earlier ones: wait 60 s · 2^2 = 240 s (next attempt counted from the database clock).
    const waitS = (row.next_attempt_at.getTime() - row.db_now.getTime()) / 1000;
    expect(waitS).toBeGreaterThan(239);
    expect(waitS).toBeLessThan(245);
    expect(await deliverDueMail(deps, { kinds: [kind] })).toEqual({ sent: 0, failed: 0 }); // not due yet

    await pool.query("UPDATE mail_outbox SET attempts = 19, next_attempt_at = now() WHERE kind = $1", [kind]);
    expect(await deliverDueMail(deps, { kinds: [kind] })).toEqual({ sent: 0, failed: 1 });
    expect((await outboxRows(kind))[0]).toMatchObject({ status: "failed", attempts: 20 });
  });

  it("two concurrent deliveries send every row exactly once", async () => {
    const { tag, kind } = tagged();
    const addresses = Array.from({ length: 12 }, (_, i) => `${tag}-${i}@example.test`);
    for (const a of addresses) await enqueueMail(db, { kind, to: [a], subject: `Race ${tag}`, body: a });
    const drain = async () => {
      let sent = 0;
      for (;;) {
        const r = await deliverDueMail(app.deps, { kinds: [kind], limit: 2 });
        if (r.sent + r.failed === 0) return sent;
        sent += r.sent;
      }
    };
    const [a, b] = await Promise.all([drain(), drain()]);
    expect(a + b).toBe(12);
    const got = await pool.query(
      "SELECT message_id, count(*)::int AS n FROM mail_sink_messages WHERE subject = $1 GROUP BY message_id",
      [`Race ${tag}`],
    );
    expect(got.rows).toHaveLength(12);
    expect(got.rows.every((r) => r.n === 1)).toBe(true);
    expect((await outboxRows(kind)).every((r) => r.status === "sent" && r.attempts === 1)).toBe(true);
  });
});

/** Holds the worker's next scheduled run; `step()` runs it and resolves once the worker has scheduled the one after. */
function handClock() {
  let next: (() => void) | undefined;
  let rescheduled: (() => void) | undefined;
  const clock: WorkerClock = {
    setTimeout(run) {
      next = run;
      rescheduled?.();
      return { unref: () => undefined };
    },
    clearTimeout() {
      next = undefined;
    },
  };
  const step = () =>
    new Promise<void>((resolve) => {
      const run = next;
      if (!run) throw new Error("the worker has no run scheduled");
      next = undefined;
      rescheduled = resolve;
      run();
    });
  return { clock, step, pending: () => next !== undefined };
}

describe("outbox worker and missing SMTP", () => {
  it("the worker delivers on its own, and after stop() it sends nothing more", async () => {
    const { kind, to } = tagged();
    await drain(); // other files' queued mail would otherwise stand before this test's row
    const hand = handClock();
    const worker = startOutboxWorker(app.deps, 50, hand.clock);
    try {
      expect(hand.pending()).toBe(true); // the first run is scheduled at start
      await enqueueMail(db, { kind, to: [to[0]], subject: "by the worker", body: "x" });
      // each step is one whole delivery run (other files' mail may share the outbox, so allow a few)
      for (let i = 0; i < 5 && (await sinkFor(to[0])).length === 0; i++) await hand.step();
      expect(await sinkFor(to[0])).toHaveLength(1);
      expect(hand.pending()).toBe(true); // and it keeps polling
    } finally {
      await worker.stop();
    }
    // stop() cancelled the next run and schedules none: no run can ever send what comes after
    expect(hand.pending()).toBe(false);
    await enqueueMail(db, { kind, to: [to[1]], subject: "after stop", body: "x" });
    expect(await sinkFor(to[1])).toHaveLength(0);
    expect((await outboxRows(kind)).map((r) => r.status)).toEqual(["sent", "pending"]);
  });

  it("without an SMTP URL, rows stay pending and untouched", async () => {
    const { kind, to } = tagged();
    await enqueueMail(db, { kind, to, subject: "no smtp", body: "x" });
    const deps: AppDeps = { ...app.deps, config: { ...app.deps.config, smtpUrl: undefined } };
    expect(await deliverDueMail(deps, { kinds: [kind] })).toEqual({ sent: 0, failed: 0 });
    expect(await outboxRows(kind)).toMatchObject([{ status: "pending", attempts: 0, last_error: null }]);
  });
});

describe("GET /api/mail", () => {
  it("is for admins only", async () => {
    for (const role of ["researcher", "infra", "approver", "viewer"] as const) {
      const a = await app.agentAs([role]);
      await a.get("/api/mail").expect(403);
      await a.post("/api/mail/deliver").set("X-CSRF-Token", a.csrf).expect(403);
    }
    await (await app.agent()).get("/api/mail").expect(401);
    await (await app.agentAs(["admin"])).get("/api/mail").expect(200);
  });

  it("lists received messages newest first, filters by subject or recipient, and shows the outbox", async () => {
    const { tag, kind, to } = tagged();
    await enqueueMail(db, { kind, to: [to[0]], subject: `First ${tag}`, body: "one" });
    await enqueueMail(db, { kind, to: [to[1]], subject: `Second ${tag}`, body: "two" });
    await enqueueMail(db, { kind, to: [to[1]], subject: `Third ${tag}`, body: "three" }); // stays pending
    await deliverDueMail(app.deps, { kinds: [kind], limit: 2 });

    const admin = await app.agentAs(["admin"]);
    const all = await admin.get("/api/mail").query({ q: tag }).expect(200);
    expect(all.body.messages.map((m: { subject: string }) => m.subject)).toEqual([`Second ${tag}`, `First ${tag}`]);
    expect(all.body.messages[0]).toMatchObject({
      from: "ropewalk@ropewalk.test",
      to: [to[1]],
      text: expect.stringContaining("two"),
    });
    expect(typeof all.body.messages[0].receivedAt).toBe("string");

    const byRecipient = await admin.get("/api/mail").query({ q: to[0].toUpperCase() }).expect(200);
    expect(byRecipient.body.messages.map((m: { subject: string }) => m.subject)).toEqual([`First ${tag}`]);
    // % is a literal character in the filter, not a wildcard.
    expect(
      (
        await admin
          .get("/api/mail")
          .query({ q: `First%${tag}` })
          .expect(200)
      ).body.messages,
    ).toEqual([]);

    const mine = all.body.outbox.filter((o: { kind: string }) => o.kind === kind);
    expect(mine.map((o: { subject: string; status: string }) => [o.subject, o.status])).toEqual([
      [`Third ${tag}`, "pending"],
      [`Second ${tag}`, "sent"],
      [`First ${tag}`, "sent"],
    ]);
    expect(mine[1]).toMatchObject({ to: [to[1]], attempts: 1, lastError: null, sentAt: expect.any(String) });
  });

  it("outbox rows of workflow mail name their plan and revision and carry the body; the search narrows the outbox too", async () => {
    const researcher = await app.agentAs(["researcher"]);
    await app.agentAs(["approver"]); // someone to ask
    const title = `Outbox plan ${crypto.randomBytes(4).toString("hex")}`;
    const plan = await createPlan(researcher, (await createProfile(researcher)).id, { title });
    await post(researcher, `/api/plans/${plan.id}/revisions/1/submit`).expect(200);
    const admin = await app.agentAs(["admin"]);
    const found = (await admin.get("/api/mail").query({ q: title }).expect(200)).body;
    expect(found.outbox.length).toBeGreaterThan(0);
    for (const row of found.outbox) {
      expect(row).toMatchObject({
        kind: "plan.review_requested",
        subject: `For inspection: "${title}" rev. 1, round 1`,
        plan: { id: plan.id, title, revision: 1 },
        nextAttemptAt: expect.any(String),
      });
      expect(row.body).toContain(`/plans/${plan.id}?revision=1`);
    }
    // Mail queued without a plan has none.
    const { tag, kind, to } = tagged();
    await enqueueMail(db, { kind, to, subject: `Plain ${tag}`, body: "plain" });
    const plain = (await admin.get("/api/mail").query({ q: tag }).expect(200)).body.outbox;
    expect(plain).toMatchObject([{ subject: `Plain ${tag}`, plan: null, body: "plain" }]);
  });

  it("POST /api/mail/deliver sends what is due now", async () => {
    const { tag, kind, to } = tagged();
    await drain();
    await enqueueMail(db, { kind, to, subject: `Now ${tag}`, body: "now" });
    const admin = await app.agentAs(["admin"]);
    const r = await admin.post("/api/mail/deliver").set("X-CSRF-Token", admin.csrf).expect(200);
    expect(r.body.sent).toBeGreaterThanOrEqual(1);
    expect(await sinkFor(to[0])).toHaveLength(1);
  });
});
