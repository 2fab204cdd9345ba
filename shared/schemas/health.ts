import { z } from 'zod';
import '../messages.ts';

/** GET /api/health: 200 when the database answers, 503 (same body, ok false) when it does not. */
export const healthSchema = z.object({ ok: z.boolean(), db: z.enum(['up', 'down']), version: z.string() });
export type Health = z.infer<typeof healthSchema>;
