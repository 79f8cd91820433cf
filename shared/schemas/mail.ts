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
});
export type OutboxRow = z.infer<typeof outboxRowSchema>;

export const mailViewSchema = z.object({ messages: z.array(sinkMessageSchema), outbox: z.array(outboxRowSchema) });
export type MailView = z.infer<typeof mailViewSchema>;
export const deliveryResultSchema = z.object({ sent: z.number(), failed: z.number() });
