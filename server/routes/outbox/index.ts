import { Router } from 'express';
import { toPaged } from '../../../shared/schemas/common.ts';
import { outboxQuery, type OutboxMessage } from '../../../shared/schemas/outbox.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { forbidden } from '../../http/errors.ts';
import { parseQuery } from '../../http/validate.ts';
import { mailDir } from '../../mail/index.ts';
import { mailFiles, readMail, type CaughtMail } from '../../mail/outbox.ts';
import { can } from '../../policies/index.ts';

/** The local catcher's mail, newest first; mounted only outside production. */
export const outboxRouter = Router();

outboxRouter.get('/', requireUser, async (req, res) => {
  const { page, pageSize } = parseQuery(outboxQuery, req);
  if (!can(actorOf(req), 'outbox:read')) throw forbidden();
  const files = await mailFiles(mailDir());
  const items = await Promise.all(
    files.slice((page - 1) * pageSize, page * pageSize).map((f) => readMail(mailDir(), f)),
  );
  // The HTML part stays out of the list (the page shows the text).
  const present = ({ id, subject, from, to, date, text }: CaughtMail): OutboxMessage => ({
    id,
    subject,
    from,
    to,
    date,
    text,
  });
  res.json(toPaged(items.map(present), files.length, page, pageSize));
});
