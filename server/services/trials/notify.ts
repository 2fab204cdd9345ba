import { publicUrl } from '../../env.ts';
import { logger } from '../../log/index.ts';
import { sendMail } from '../../mail/index.ts';
import { letter } from '../../mail/templates.ts';
import { Piece, User, type Trial } from '../../models/index.ts';
import type { Actor } from '../../policies/index.ts';

export const trialUrl = (id: number) => `${publicUrl}/trials/${id}`;

/**
 * Tell the curator who catalogued a piece that a trial now reproduces it. Sent after
 * the trial is saved: a mail failure is logged and reported, it never undoes the trial.
 */
export async function notifyCurator(trial: Trial, actor: Actor): Promise<boolean> {
  if (trial.pieceId == null) return false;
  const piece = await Piece.findByPk(trial.pieceId, { paranoid: false });
  const curator = piece?.createdById != null ? await User.findByPk(piece.createdById) : null;
  if (!piece || !curator || !curator.active || curator.id === actor?.id) return false;
  const dyer = actor ? await User.findByPk(actor.id) : null;
  try {
    await sendMail(
      letter({
        to: curator.email,
        subject: `Trial ${trial.code} now reproduces ${piece.accessionNumber}`,
        greeting: `Hello ${curator.name},`,
        paragraphs: [
          `${dyer?.name ?? 'A dyer'} attached the reproduction trial ${trial.code} to ${piece.accessionNumber} (${piece.title}), which you catalogued.`,
          'The trial page shows its recipe, the substitutions for historical mordants and, once measured, how close the result is to the original.',
        ],
        action: { label: `Open trial ${trial.code}`, url: trialUrl(trial.id) },
      }),
    );
    return true;
  } catch (err) {
    logger.error({ err, trial: trial.code }, '[mail] trial notice not sent');
    return false;
  }
}
