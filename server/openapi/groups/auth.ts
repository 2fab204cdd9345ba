import { defineRoutes } from '../registry.ts';
import { loginSchema, resetLinkSchema, resetRequestedSchema, sessionSchema } from '../../../shared/schemas/auth.ts';
import { resetPasswordSchema, resetRequestSchema, tokenParams } from '../../../shared/schemas/team.ts';

export default defineRoutes('auth', [
  {
    method: 'post',
    path: '/api/auth/login',
    summary: 'Sign in; answers the user and their abilities',
    roles: 'anyone',
    body: loginSchema,
    responses: { 200: sessionSchema },
  },
  {
    method: 'post',
    path: '/api/auth/logout',
    summary: 'Sign out and end the session',
    roles: 'anyone',
    responses: { 204: null },
  },
  {
    method: 'get',
    path: '/api/auth/me',
    summary: 'The signed-in user and their abilities (401 for a visitor)',
    roles: 'signed in',
    responses: { 200: sessionSchema },
  },
  {
    method: 'post',
    path: '/api/auth/password-reset',
    summary: 'Ask for a link to set a new password (the same answer whatever the address)',
    roles: 'anyone',
    body: resetRequestSchema,
    responses: { 202: resetRequestedSchema },
  },
  {
    method: 'get',
    path: '/api/auth/password-reset/:token',
    summary: 'Check a reset link before the form opens: until when it works',
    roles: 'anyone',
    params: tokenParams,
    responses: { 200: resetLinkSchema },
  },
  {
    method: 'post',
    path: '/api/auth/password-reset/:token',
    summary: 'Set a new password with a reset link',
    roles: 'anyone',
    params: tokenParams,
    body: resetPasswordSchema,
    responses: { 204: null },
  },
]);
