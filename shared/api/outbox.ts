import { z } from 'zod';

/**
 * Local outbox (development and demo only; the route does not exist in production):
 * GET /api/dev/outbox       -> { messages: outboxMessageSummary[] } newest first
 * GET /api/dev/outbox/:id   -> outboxMessage
 */
export const outboxMessageSummarySchema = z.object({
  id: z.string(),
  to: z.array(z.string()),
  from: z.string(),
  subject: z.string(),
  receivedAt: z.string(),
});
export const outboxMessageSchema = outboxMessageSummarySchema.extend({
  text: z.string(),
  html: z.string().nullable(),
});
export type OutboxMessageSummary = z.infer<typeof outboxMessageSummarySchema>;
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;
