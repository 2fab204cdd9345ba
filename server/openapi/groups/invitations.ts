import { defineRoutes } from '../registry.ts';
import { acceptInvitationSchema, inviteSchema, tokenParams } from '../../../shared/schemas/team.ts';
import { acceptedResponse, invitationResponse } from '../../../shared/schemas/invitations.ts';

export default defineRoutes('invitations', [
  {
    method: 'post',
    path: '/api/invitations',
    summary: 'Invite someone by e-mail with a role',
    roles: 'admin',
    body: inviteSchema,
    responses: { 201: invitationResponse },
  },
  {
    method: 'get',
    path: '/api/invitations/:token',
    summary: 'The invitation behind a link: address, role and until when it works',
    roles: 'anyone',
    params: tokenParams,
    responses: { 200: invitationResponse },
  },
  {
    method: 'post',
    path: '/api/invitations/:token/accept',
    summary: 'Accept an invitation with a name and password; the new member is signed in',
    roles: 'anyone',
    params: tokenParams,
    body: acceptInvitationSchema,
    responses: { 201: acceptedResponse },
  },
]);
