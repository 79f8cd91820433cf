import type { AppDeps } from "../../deps";
import { DEFAULT_BATCH, deliverDueMail, type DeliveryResult } from "../../mailer/outbox";
import type { MailView } from "../../../shared/schemas/mail";
import * as repo from "./mail.repo";

/** The Mail page shows at most this many of each list, newest first. */
export const MAIL_PAGE_LIMIT = 200;

export async function listMail(deps: AppDeps, q?: string): Promise<MailView> {
  const [messages, outbox] = await Promise.all([
    repo.listSinkMessages(deps.db, MAIL_PAGE_LIMIT, q),
    repo.listOutbox(deps.db, MAIL_PAGE_LIMIT, q),
  ]);
  return {
    messages: messages.map((m) => ({ ...m, receivedAt: m.receivedAt.toISOString() })),
    outbox: outbox.map(({ planId, planTitle, revision, ...o }) => ({
      ...o,
      createdAt: o.createdAt.toISOString(),
      sentAt: o.sentAt?.toISOString() ?? null,
      nextAttemptAt: o.nextAttemptAt.toISOString(),
      plan: planId !== null && planTitle !== null ? { id: planId, title: planTitle, revision } : null,
    })),
  };
}

/** Batches one "deliver now" may run, so a large backlog cannot hold the request for long. */
const DELIVER_NOW_MAX_BATCHES = 10;

/** "Deliver now" on the Mail page: what is due, without waiting for the worker. */
export async function deliverNow(deps: AppDeps): Promise<DeliveryResult> {
  const total = { sent: 0, failed: 0 };
  for (let i = 0; i < DELIVER_NOW_MAX_BATCHES; i++) {
    const r = await deliverDueMail(deps);
    total.sent += r.sent;
    total.failed += r.failed;
    // Stop at a short batch, or at a failure: the server is struggling and the worker retries later.
    if (r.sent < DEFAULT_BATCH) break;
  }
  return total;
}
