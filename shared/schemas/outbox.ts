import { z } from 'zod';
import '../messages.ts';
import { pageQuery, paged } from './common.ts';

/** GET /api/outbox: 20 a page unless asked. */
export const outboxQuery = pageQuery(20);

/** One message caught by the local mail catcher (server/mail/outbox.ts), without its HTML part. */
export const outboxMessageSchema = z.object({
  id: z.string(),
  subject: z.string(),
  from: z.string(),
  to: z.array(z.string()),
  date: z.iso.datetime().nullable(),
  text: z.string(),
});
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;
export const outboxPageSchema = paged(outboxMessageSchema);
export type OutboxPage = z.infer<typeof outboxPageSchema>;
