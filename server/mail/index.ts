import path from 'node:path';
import nodemailer, { type Transporter } from 'nodemailer';
import { env, isProduction } from '../env.ts';
import { startMailCatcher, type MailCatcher } from './catcher.ts';

export type MailMessage = { to: string; subject: string; text: string; html: string };

/** Where the local catcher keeps its .eml files. */
export const mailDir = () => path.join(env.DATA_DIR, 'mail');

let transport: Transporter | null = env.SMTP_URL ? nodemailer.createTransport(env.SMTP_URL) : null;

/** The catcher offers no TLS; a real relay given by SMTP_URL negotiates as usual. */
function useCatcher(port: number) {
  transport?.close();
  transport = nodemailer.createTransport({ host: '127.0.0.1', port, secure: false, ignoreTLS: true });
}

/**
 * Start the local catcher when no real relay is configured (never in production)
 * and send all mail to it. Returns null when SMTP_URL is set.
 */
export async function startLocalMail(port = 0): Promise<MailCatcher | null> {
  if (env.SMTP_URL) return null;
  if (isProduction)
    throw new Error('SMTP_URL is required in production; the local mail catcher runs only outside production.');
  const catcher = await startMailCatcher(mailDir(), port);
  useCatcher(catcher.port);
  return {
    ...catcher,
    close: async () => {
      transport?.close();
      transport = null;
      await catcher.close();
    },
  };
}

/** Send one message with a plain-text and an HTML part. Everyone sends mail through this. */
export async function sendMail(message: MailMessage): Promise<void> {
  if (!transport)
    throw new Error('No mail transport: set SMTP_URL, or start the local catcher (startLocalMail) first.');
  await transport.sendMail({ from: env.MAIL_FROM, ...message });
}
