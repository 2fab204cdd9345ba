import type { Role } from '../../shared/roles.ts';
import { letter } from './templates.ts';

const roleWords: Record<Role, string> = {
  admin: 'an admin',
  curator: 'a curator',
  researcher: 'a researcher',
  dyer: 'a dyer',
};
const when = (d: Date) => d.toISOString().replace('T', ' ').slice(0, 16) + ' UTC';

export const invitationLetter = (m: { to: string; role: Role; inviter: string; url: string; expiresAt: Date }) =>
  letter({
    to: m.to,
    subject: 'You are invited to join Tinctoria',
    greeting: 'Hello,',
    paragraphs: [
      `${m.inviter} has invited you to join the team in Tinctoria as ${roleWords[m.role]}.`,
      'Follow the link to choose your name as others will see it and a password. The link works once.',
    ],
    action: { label: 'Join the team', url: m.url },
    footnote: `This invitation expires on ${when(m.expiresAt)}. If you did not expect it, ignore this message.`,
  });

export const resetLetter = (m: { to: string; name: string; url: string; expiresAt: Date }) =>
  letter({
    to: m.to,
    subject: 'Set a new Tinctoria password',
    greeting: `Hello ${m.name},`,
    paragraphs: [
      'Someone asked to set a new password for your Tinctoria account. Follow the link to choose one; it works once and signs you out everywhere else.',
    ],
    action: { label: 'Choose a new password', url: m.url },
    footnote: `The link expires on ${when(m.expiresAt)}. If you did not ask for it, ignore this message: your password stays as it is.`,
  });
