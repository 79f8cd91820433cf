import { desc, eq, ilike, or, sql } from "drizzle-orm";
import { containsPattern } from "../../platform/paging";
import type { Executor } from "../../db/client";
import { mailOutbox, mailSinkMessages, plans } from "../../db/schema";

export function listSinkMessages(ex: Executor, limit: number, q?: string) {
  const where = q
    ? or(
        ilike(mailSinkMessages.subject, containsPattern(q)),
        // The expression of the trigram index mail_sink_to_trgm (migration 0013), so the search is an index look-up.
        sql`rw_text_list(${mailSinkMessages.toAddresses}) ilike ${containsPattern(q)}`,
      )
    : undefined;
  return ex
    .select({
      id: mailSinkMessages.id,
      receivedAt: mailSinkMessages.receivedAt,
      from: mailSinkMessages.fromAddress,
      to: mailSinkMessages.toAddresses,
      subject: mailSinkMessages.subject,
      text: mailSinkMessages.text,
    })
    .from(mailSinkMessages)
    .where(where)
    .orderBy(desc(mailSinkMessages.id))
    .limit(limit);
}

/** Newest first; `q` narrows to a subject or recipient, as for the received messages. */
export function listOutbox(ex: Executor, limit: number, q?: string) {
  const where = q
    ? or(
        ilike(mailOutbox.subject, containsPattern(q)),
        sql`rw_text_list(${mailOutbox.toAddresses}) ilike ${containsPattern(q)}`,
      )
    : undefined;
  return ex
    .select({
      id: mailOutbox.id,
      kind: mailOutbox.kind,
      to: mailOutbox.toAddresses,
      subject: mailOutbox.subject,
      status: mailOutbox.status,
      attempts: mailOutbox.attempts,
      lastError: mailOutbox.lastError,
      createdAt: mailOutbox.createdAt,
      sentAt: mailOutbox.sentAt,
      nextAttemptAt: mailOutbox.nextAttemptAt,
      body: mailOutbox.body,
      planId: mailOutbox.planId,
      planTitle: plans.title,
      revision: mailOutbox.revision,
    })
    .from(mailOutbox)
    .leftJoin(plans, eq(plans.id, mailOutbox.planId))
    .where(where)
    .orderBy(desc(mailOutbox.id))
    .limit(limit);
}
