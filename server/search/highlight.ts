import type { PieceDoc } from './docs.ts';
import type { TextField } from './text-index.ts';

export type Highlight = { field: TextField; text: string; marks: Array<[number, number]> };

const RADIUS = 60;

function fieldText(doc: PieceDoc, field: TextField): string | null {
  switch (field) {
    case 'techniques':
    case 'dyestuffs':
    case 'historicalMordants':
    case 'modernMordants':
      return doc[field].join(', ');
    case 'trialCode':
    case 'notes':
      return null;
    default:
      return doc[field];
  }
}

/**
 * Short snippets around the matched words, with character ranges to mark. Plain
 * text plus offsets, so the client renders <mark> itself and nothing is injected.
 */
export function highlights(doc: PieceDoc, terms: Iterable<string>, fields: Iterable<TextField>): Highlight[] {
  const words = [...terms].filter(Boolean);
  const out: Highlight[] = [];
  for (const field of fields) {
    const full = fieldText(doc, field);
    if (!full) continue;
    const lower = full.toLowerCase();
    const found: Array<[number, number]> = [];
    for (const w of words) {
      let at = lower.indexOf(w);
      while (at >= 0 && found.length < 8) {
        found.push([at, at + w.length]);
        at = lower.indexOf(w, at + w.length);
      }
    }
    if (!found.length) continue;
    found.sort((x, y) => x[0] - y[0]);
    const start = Math.max(0, found[0][0] - RADIUS);
    const end = Math.min(full.length, found[0][1] + RADIUS * 2);
    const prefix = start > 0 ? '…' : '';
    const text = prefix + full.slice(start, end) + (end < full.length ? '…' : '');
    const marks = found
      .filter(([s, e]) => s >= start && e <= end)
      .map(([s, e]): [number, number] => [s - start + prefix.length, e - start + prefix.length]);
    out.push({ field, text, marks });
  }
  return out;
}
