import { Router } from 'express';
import { z } from 'zod';
import { actorOf, requireUser } from '../../http/auth.ts';
import { forbidden } from '../../http/errors.ts';
import { parseQuery } from '../../http/validate.ts';
import { mailDir } from '../../mail/index.ts';
import { mailFiles, readMail } from '../../mail/outbox.ts';
import { can } from '../../policies/index.ts';

const outboxQuery = z.object({ page: z.coerce.number().int().min(1).default(1), pageSize: z.coerce.number().int().min(1).max(100).default(20) });

/** The local catcher's mail, newest first; mounted only outside production. */
export const outboxRouter = Router();

outboxRouter.get('/', requireUser, async (req, res) => {
  const { page, pageSize } = parseQuery(outboxQuery, req);
  if (!can(actorOf(req), 'outbox:read')) throw forbidden();
  const files = await mailFiles(mailDir());
  const items = await Promise.all(files.slice((page - 1) * pageSize, page * pageSize).map((f) => readMail(mailDir(), f)));
  res.json({ items: items.map(({ id, subject, from, to, date, text }) => ({ id, subject, from, to, date, text })), total: files.length, page, pageSize });
});
