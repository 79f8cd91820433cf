import { desc, ilike, or, sql } from "drizzle-orm";
import { containsPattern } from "../../platform/paging";
import type { Executor } from "../../db/client";
import { mailOutbox, mailSinkMessages } from "../../db/schema";

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

export function listOutbox(ex: Executor, limit: number) {
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
    })
    .from(mailOutbox)
    .orderBy(desc(mailOutbox.id))
    .limit(limit);
}
