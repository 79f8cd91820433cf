import { z } from "zod";

/* The admin mail views: the local sink's messages and the outbox (server/features/mail/mail.service.ts). */

export const sinkMessageSchema = z.object({
  id: z.number(),
  receivedAt: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
});
export type SinkMessage = z.infer<typeof sinkMessageSchema>;

export const outboxRowSchema = z.object({
  id: z.number(),
  kind: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  status: z.string(),
  attempts: z.number(),
  lastError: z.string().nullable(),
  createdAt: z.string(),
  sentAt: z.string().nullable(),
  /** When the next try is due (pending rows). */
  nextAttemptAt: z.string(),
  /** The plain-text body, opened in place on the Mail page. */
  body: z.string(),
  /** The plan and revision a workflow message is about (null for other mail and for rows queued before they were kept). */
  plan: z.object({ id: z.number(), title: z.string(), revision: z.number().nullable() }).nullable(),
});
export type OutboxRow = z.infer<typeof outboxRowSchema>;

export const mailViewSchema = z.object({ messages: z.array(sinkMessageSchema), outbox: z.array(outboxRowSchema) });
export type MailView = z.infer<typeof mailViewSchema>;
export const deliveryResultSchema = z.object({ sent: z.number(), failed: z.number() });
