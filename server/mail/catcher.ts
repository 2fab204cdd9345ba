import { randomBytes } from 'node:crypto';
import { mkdirSync } from 'node:fs';
import { writeFile } from 'node:fs/promises';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';

export type MailCatcher = { port: number; dir: string; url: string; close: () => Promise<void> };

/**
 * The local fake relay: a real SMTP server on 127.0.0.1 that keeps every message
 * it receives as an .eml file, so mail can be read without sending any.
 */
export async function startMailCatcher(dir: string, port = 0): Promise<MailCatcher> {
  mkdirSync(dir, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    banner: 'Tinctoria local mail catcher',
    logger: false,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('error', callback);
      stream.on('end', () => {
        // Time first in the name so the newest message sorts last.
        const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${randomBytes(4).toString('hex')}.eml`;
        writeFile(path.join(dir, name), Buffer.concat(chunks)).then(() => callback(), callback);
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  const actual = (server.server.address() as AddressInfo).port;
  return {
    port: actual,
    dir,
    url: `smtp://127.0.0.1:${actual}`,
    close: () => new Promise((resolve) => server.close(() => resolve())),
  };
}
