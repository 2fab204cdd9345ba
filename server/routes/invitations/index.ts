import { Router } from 'express';
import { acceptInvitationSchema, inviteSchema, tokenParams } from '../../../shared/schemas/team.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { forbidden } from '../../http/errors.ts';
import { parseBody, parseParams } from '../../http/validate.ts';
import { sequelize } from '../../models/index.ts';
import { can } from '../../policies/index.ts';
import { presentInvitation } from '../../presenters/invitation.ts';
import { presentUser } from '../../presenters/user.ts';
import { acceptInvitation, inviteMember, liveInvitation } from '../../services/invitations.ts';

export const invitationsRouter = Router();

invitationsRouter.post('/', requireUser, async (req, res) => {
  const input = parseBody(inviteSchema, req);
  const actor = actorOf(req);
  if (!can(actor, 'team:manage')) throw forbidden();
  const record = await sequelize.transaction((transaction) => inviteMember({ actor, transaction, input }));
  res.status(201).json({ invitation: presentInvitation(record) });
});

// Public: the acceptance page shows the address and role before asking for a name and password.
invitationsRouter.get('/:token', async (req, res) => {
  const { token } = parseParams(tokenParams, req);
  res.json({ invitation: presentInvitation(await liveInvitation(token)) });
});

invitationsRouter.post('/:token/accept', async (req, res, next) => {
  const { token } = parseParams(tokenParams, req);
  const input = parseBody(acceptInvitationSchema, req);
  const user = await sequelize.transaction((transaction) =>
    acceptInvitation({ actor: actorOf(req), transaction, input: { ...input, token } }),
  );
  // The new member is signed in straight away (a fresh session id, as at every sign-in).
  req.logIn(user, (e) => (e ? next(e) : res.status(201).json({ user: presentUser(user) })));
});
