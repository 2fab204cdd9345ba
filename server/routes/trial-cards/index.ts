import { Router } from 'express';
import { idParams } from '../../../shared/schemas/common.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { notFound } from '../../http/errors.ts';
import { parseParams } from '../../http/validate.ts';
import { Trial } from '../../models/index.ts';
import { can } from '../../policies/index.ts';
import { loadCards } from '../../pdf/card-data.ts';
import { cardsPdf } from '../../pdf/cards.ts';
import { sendPdf } from '../../pdf/send.ts';

/** The printable sample card of one trial; downloads follow the trial's read rule. */
export const trialCardsRouter = Router();

trialCardsRouter.get('/:id/card.pdf', requireUser, async (req, res) => {
  const { id } = parseParams(idParams, req);
  const trial = await Trial.findByPk(id, { attributes: ['id', 'code', 'dyerId'] });
  if (!trial || !can(actorOf(req), 'trial:read', { ownerId: trial.dyerId })) throw notFound('Trial');
  sendPdf(res, `${trial.code}-card.pdf`, await cardsPdf(`Sample card ${trial.code}`, await loadCards([trial.id])));
});
