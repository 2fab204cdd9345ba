import { defineRoutes } from '../registry.ts';
import { idParams } from '../../../shared/schemas/common.ts';
import {
  memberResponse,
  pendingInvitationListSchema,
  pendingInvitationResponse,
  teamPageSchema,
  teamPatchSchema,
  teamQuerySchema,
} from '../../../shared/schemas/team.ts';

export default defineRoutes('team', [
  {
    method: 'get',
    path: '/api/team',
    summary: 'The team, active members first',
    roles: 'admin',
    query: teamQuerySchema,
    responses: { 200: teamPageSchema },
  },
  {
    method: 'patch',
    path: '/api/team/:id',
    summary: "Change a member's role or switch their account off or on",
    roles: 'admin',
    params: idParams,
    body: teamPatchSchema,
    responses: { 200: memberResponse },
  },
  {
    method: 'get',
    path: '/api/team/invitations',
    summary: 'Pending invitations with who sent them',
    roles: 'admin',
    responses: { 200: pendingInvitationListSchema },
  },
  {
    method: 'post',
    path: '/api/team/invitations/:id/resend',
    summary: 'Send a pending invitation again with a new link',
    roles: 'admin',
    params: idParams,
    responses: { 201: pendingInvitationResponse },
  },
  {
    method: 'delete',
    path: '/api/team/invitations/:id',
    summary: 'Withdraw a pending invitation',
    roles: 'admin',
    params: idParams,
    responses: { 204: null },
  },
]);
