import { formatNumber } from '../../../shared/format';
// Number formatting for quantities: fixed decimals so columns line up (shown with tabular figures).
export const fmt = (x: number | null | undefined, decimals = 1) =>
  x == null || !Number.isFinite(x) ? '—' : formatNumber(x, decimals);
/** Grams to a bench balance's resolution; milligrams below one gram so small metal loads stay visible. */
export const grams = (g: number | null | undefined) =>
  g == null ? '—' : Math.abs(g) < 1 && g !== 0 ? `${(g * 1000).toFixed(0)} mg` : `${g.toFixed(2)} g`;
export const lab = (c: { L: number; a: number; b: number }) =>
  `L* ${formatNumber(c.L)}  a* ${formatNumber(c.a)}  b* ${formatNumber(c.b)}`;

export const STATUS_WORDS = {
  planned: 'Planned',
  'in-progress': 'In progress',
  finished: 'Finished',
  abandoned: 'Abandoned',
} as const;
export const REASON_WORDS = {
  toxicity: 'Toxicity',
  regulation: 'Regulation',
  availability: 'Availability',
  waste: 'Waste',
} as const;
export const METAL_NAMES: Record<string, string> = {
  Pb: 'lead',
  Cr: 'chromium',
  Sn: 'tin',
  Cu: 'copper',
  As: 'arsenic',
  Al: 'aluminium',
  Fe: 'iron',
  Zn: 'zinc',
  Sb: 'antimony',
};
export const VERDICT_WORDS: Record<string, string> = {
  match: 'Match',
  close: 'Close',
  near: 'Near',
  different: 'Different',
};
