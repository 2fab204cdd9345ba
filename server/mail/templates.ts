import type { MailMessage } from './index.ts';

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

type Letter = {
  to: string;
  subject: string;
  greeting: string;
  paragraphs: string[];
  action?: { label: string; url: string };
  footnote?: string;
};

/** Every message names the product and carries the same words as text and as HTML. */
export function letter({ to, subject, greeting, paragraphs, action, footnote }: Letter): MailMessage {
  const sign = 'Tinctoria — archive and reproduction notebook for dyed and printed textiles';
  const text = [
    greeting,
    '',
    ...paragraphs.flatMap((p) => [p, '']),
    ...(action ? [`${action.label}: ${action.url}`, ''] : []),
    ...(footnote ? [footnote, ''] : []),
    '— ',
    sign,
  ].join('\n');
  const p = (s: string) => `<p style="margin:0 0 12px">${escapeHtml(s)}</p>`;
  const html = `<!doctype html><html><body style="font-family:sans-serif;color:#222;max-width:560px">
${p(greeting)}
${paragraphs.map(p).join('\n')}
${action ? `<p style="margin:16px 0"><a href="${escapeHtml(action.url)}" style="background:#2f4f6f;color:#fff;padding:8px 14px;border-radius:6px;text-decoration:none">${escapeHtml(action.label)}</a></p><p style="font-size:12px;color:#555">Or paste this address into your browser: ${escapeHtml(action.url)}</p>` : ''}
${footnote ? `<p style="font-size:12px;color:#555">${escapeHtml(footnote)}</p>` : ''}
<p style="font-size:12px;color:#777;border-top:1px solid #ddd;padding-top:8px">${escapeHtml(sign)}</p>
</body></html>`;
  return { to, subject, text, html };
}
