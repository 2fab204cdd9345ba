import { defineRoutes } from '../registry.ts';
import { homeResponse } from '../../../shared/schemas/home.ts';

export default defineRoutes('home', [
  {
    method: 'get',
    path: '/api/home',
    summary:
      'My landing page by role: curator (drafts, photos without a reference patch, light allowance), researcher (analyses, saved searches), dyer (trials in progress, baths due a check, planned series), admin (team, invitations, fixity, job queue)',
    roles: 'admin, curator, researcher, dyer',
    responses: { 200: homeResponse },
  },
]);
