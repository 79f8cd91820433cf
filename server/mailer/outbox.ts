/**
 * Mail outbox: state changes write their mail in the same transaction (enqueueMail), and a worker
 * delivers due rows over SMTP. Rows are claimed with FOR UPDATE SKIP LOCKED and stay locked while
 * they are sent, so several app instances sharing one database never send the same row twice.
 */
import nodemailer from "nodemailer";
import { and, asc, eq, inArray, lte, sql } from "drizzle-orm";
import type { Config } from "../config";
import type { Db, Executor } from "../db/client";
import { mailOutbox } from "../db/schema";
import { retryDelayMs, MAX_ATTEMPTS } from "./retry";

export interface OutgoingMail {
  kind: string;
  to: string[];
  subject: string;
  body: string;
  /** The plan and revision a workflow message is about; the Mail page groups deliveries by plan. */
  planId?: number;
  revision?: number;
}

export interface DeliverOptions {
  /** Rows claimed per call (default 20). */
  limit?: number;
  /** Deliver only these kinds; the worker sends every kind. */
  kinds?: string[];
}

/** Counts of this call's attempts; a failed attempt leaves its row pending until MAX_ATTEMPTS. */
export interface DeliveryResult {
  sent: number;
  failed: number;
}

type MailDeps = { db: Db; config: Pick<Config, "smtpUrl" | "mailFrom" | "mailRetryBaseMs"> };

export const DEFAULT_BATCH = 20;
const ERROR_TEXT_MAX = 500;

/** Queues one message with the caller's executor, so it commits or rolls back with the change that caused it. */
export async function enqueueMail(ex: Executor, m: OutgoingMail): Promise<void> {
  const to = [...new Set(m.to.map((a) => a.trim()).filter(Boolean))];
  if (to.length === 0) return;
  await ex.insert(mailOutbox).values({
    kind: m.kind,
    toAddresses: to,
    subject: m.subject,
    body: m.body,
    planId: m.planId ?? null,
    revision: m.revision ?? null,
  });
}

/** Stable per row, so a receiver can recognise a resend after a crash between sending and committing. */
export const outboxMessageId = (id: number) => `<outbox-${id}@ropewalk.local>`;

let warnedNoSmtp = false;

/** Sends the due rows once. Without an SMTP URL (production without SMTP_URL) rows stay pending. */
export async function deliverDueMail(deps: MailDeps, opts: DeliverOptions = {}): Promise<DeliveryResult> {
  const { smtpUrl, mailFrom, mailRetryBaseMs } = deps.config;
  if (!smtpUrl) {
    if (!warnedNoSmtp) console.warn("[mail] SMTP_URL is not set: mail stays in the outbox until it is.");
    warnedNoSmtp = true;
    return { sent: 0, failed: 0 };
  }
  const limit = opts.limit ?? DEFAULT_BATCH;
  const due = and(
    eq(mailOutbox.status, "pending"),
    lte(mailOutbox.nextAttemptAt, sql`now()`),
    opts.kinds ? inArray(mailOutbox.kind, opts.kinds) : undefined,
  );

  return deps.db.transaction(async (tx) => {
    const rows = await tx
      .select()
      .from(mailOutbox)
      .where(due)
      .orderBy(asc(mailOutbox.id))
      .limit(limit)
      .for("update", { skipLocked: true });
    const result = { sent: 0, failed: 0 };
    if (rows.length === 0) return result;

    // One pooled connection carries the whole batch (a new SMTP session costs ~100 ms even on loopback);
    // the timeouts bound how long a slow server can hold the row locks.
    const transport = nodemailer.createTransport({
      url: smtpUrl,
      pool: true,
      maxConnections: 1,
      connectionTimeout: 10_000,
      greetingTimeout: 10_000,
      socketTimeout: 30_000,
    });
    try {
      for (const row of rows) {
        try {
          await transport.sendMail({
            from: mailFrom,
            to: row.toAddresses,
            subject: row.subject,
            text: row.body,
            messageId: outboxMessageId(row.id),
          });
          await tx
            .update(mailOutbox)
            .set({ status: "sent", attempts: row.attempts + 1, sentAt: sql`clock_timestamp()` })
            .where(eq(mailOutbox.id, row.id));
          result.sent++;
        } catch (e) {
          const attempts = row.attempts + 1;
          const delaySeconds = retryDelayMs(mailRetryBaseMs, row.attempts) / 1000;
          await tx
            .update(mailOutbox)
            .set({
              attempts,
              status: attempts >= MAX_ATTEMPTS ? "failed" : "pending",
              lastError: errorText(e),
              nextAttemptAt: sql`clock_timestamp() + make_interval(secs => ${delaySeconds}::double precision)`,
            })
            .where(eq(mailOutbox.id, row.id));
          result.failed++;
        }
      }
    } finally {
      transport.close();
    }
    return result;
  });
}

function errorText(e: unknown): string {
  const text = e instanceof Error ? e.message : String(e);
  return text.length > ERROR_TEXT_MAX ? `${text.slice(0, ERROR_TEXT_MAX)}…` : text;
}
