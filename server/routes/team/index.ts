import { Router } from 'express';
import { idParams, toPaged } from '../../../shared/schemas/common.ts';
import { teamPatchSchema, teamQuerySchema } from '../../../shared/schemas/team.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { forbidden } from '../../http/errors.ts';
import { parseBody, parseParams, parseQuery } from '../../http/validate.ts';
import { sequelize, User } from '../../models/index.ts';
import { can } from '../../policies/index.ts';
import { presentTeamMember } from '../../presenters/user.ts';
import { updateMember } from '../../services/team.ts';
import { pendingInvitations, resendInvitation, revokeInvitation } from '../../services/invitations.ts';
import { presentPendingInvitation } from '../../presenters/invitation.ts';

export const teamRouter = Router();

teamRouter.get('/', requireUser, async (req, res) => {
  const { page, pageSize } = parseQuery(teamQuerySchema, req);
  if (!can(actorOf(req), 'team:manage')) throw forbidden();
  const { rows, count } = await User.findAndCountAll({
    order: [
      ['active', 'DESC'],
      ['name', 'ASC'],
    ],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  });
  res.json(toPaged(rows.map(presentTeamMember), count, page, pageSize));
});

teamRouter.patch('/:id', requireUser, async (req, res) => {
  const { id } = parseParams(idParams, req);
  const input = parseBody(teamPatchSchema, req);
  const actor = actorOf(req);
  if (!can(actor, 'team:manage')) throw forbidden();
  const member = await sequelize.transaction((transaction) =>
    updateMember({ actor, transaction, input: { ...input, id } }),
  );
  res.json({ member: presentTeamMember(member) });
});

// Pending invitations: listed for admins with who sent them, sent again (a new link) or withdrawn.
teamRouter.get('/invitations', requireUser, async (req, res) => {
  if (!can(actorOf(req), 'team:manage')) throw forbidden();
  res.json({ items: (await pendingInvitations()).map(presentPendingInvitation) });
});

teamRouter.post('/invitations/:id/resend', requireUser, async (req, res) => {
  const { id } = parseParams(idParams, req);
  const actor = actorOf(req);
  if (!can(actor, 'team:manage')) throw forbidden();
  const record = await sequelize.transaction((transaction) => resendInvitation({ actor, transaction, input: { id } }));
  res.status(201).json({ invitation: presentPendingInvitation({ record, invitedBy: null }) });
});

teamRouter.delete('/invitations/:id', requireUser, async (req, res) => {
  const { id } = parseParams(idParams, req);
  const actor = actorOf(req);
  if (!can(actor, 'team:manage')) throw forbidden();
  await sequelize.transaction((transaction) => revokeInvitation({ actor, transaction, input: { id } }));
  res.status(204).end();
});
