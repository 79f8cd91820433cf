import { desc, ilike, or, sql } from "drizzle-orm";
import type { Executor } from "../../db/client";
import { mailOutbox, mailSinkMessages } from "../../db/schema";

/** ILIKE treats % and _ as wildcards; a search for "a_b" means those three characters. */
const containsPattern = (q: string) => `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

export function listSinkMessages(ex: Executor, limit: number, q?: string) {
  const where = q
    ? or(
        ilike(mailSinkMessages.subject, containsPattern(q)),
        sql`array_to_string(${mailSinkMessages.toAddresses}, ' ') ilike ${containsPattern(q)}`,
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
