import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { simpleParser, type AddressObject } from 'mailparser';

export type CaughtMail = {
  id: string;
  subject: string;
  from: string;
  to: string[];
  date: string | null;
  text: string;
  html: string | null;
};

const addresses = (a: AddressObject | AddressObject[] | undefined) =>
  (Array.isArray(a) ? a : a ? [a] : []).flatMap((o) => o.value.map((v) => v.address ?? '')).filter(Boolean);

/** The catcher's .eml file names, newest first (names start with the time). */
export async function mailFiles(dir: string): Promise<string[]> {
  const names = await readdir(dir).catch(() => [] as string[]);
  return names
    .filter((n) => n.endsWith('.eml'))
    .sort()
    .reverse();
}

export async function readMail(dir: string, id: string): Promise<CaughtMail> {
  const parsed = await simpleParser(await readFile(path.join(dir, path.basename(id))));
  return {
    id,
    subject: parsed.subject ?? '',
    from: addresses(parsed.from)[0] ?? '',
    to: addresses(parsed.to),
    date: parsed.date ? parsed.date.toISOString() : null,
    text: parsed.text ?? '',
    html: typeof parsed.html === 'string' ? parsed.html : null,
  };
}
