import { deltaE00 } from './ciede2000.ts';
import { compareMatch, type ShadeMatch } from './shade-index.ts';

/**
 * The reference answer for shade search: every colour, an exact ΔE00 each, no
 * prefilter; each piece's best colour; everything sorted. Used by the tests and
 * the benchmark to prove the indexed search returns the same thing.
 */
export function bruteForceShade(
  colours: Iterable<ShadeMatch>,
  q: { L: number; a: number; b: number; maxDeltaE: number; allow?: Uint8Array | null },
): ShadeMatch[] {
  const best = new Map<number, ShadeMatch>();
  for (const c of colours) {
    if (q.allow && !q.allow[c.pieceId]) continue;
    const de = deltaE00(q, c);
    if (de > q.maxDeltaE) continue;
    const prev = best.get(c.pieceId);
    if (!prev || de < prev.deltaE00 || (de === prev.deltaE00 && c.share > prev.share))
      best.set(c.pieceId, { ...c, deltaE00: de });
  }
  return [...best.values()].sort((x, y) =>
    compareMatch(x.deltaE00, x.share, x.pieceId, y.deltaE00, y.share, y.pieceId),
  );
}
