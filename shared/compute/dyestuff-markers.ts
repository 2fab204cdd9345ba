import { MARKER_COMPOUNDS, MORDANT_ELEMENTS } from '../data/marker-compounds.ts';

export type Finding = { substance: string; confidence: 'confirmed' | 'probable' | 'possible' | 'not-found' };
export type Suggestion = {
  name: string;
  kind: 'dyestuff' | 'mordant';
  markers: string[];
  confidence: 'confirmed' | 'probable';
};

const norm = (s: string) => s.trim().toLowerCase();

/**
 * The dyestuffs and mordant metals the findings point to: a dyestuff whose marker compound was found confirmed or
 * probable (the strongest of its markers gives the suggestion's confidence); "possible" and "not found" suggest
 * nothing. Markers: shared/data/marker-compounds.ts (Colour Index, recalled from memory).
 */
export function suggestFromFindings(findings: Finding[]): Suggestion[] {
  const found = new Map<string, Finding['confidence']>();
  for (const f of findings)
    if (f.confidence === 'confirmed' || f.confidence === 'probable') {
      const key = norm(f.substance);
      if (found.get(key) !== 'confirmed') found.set(key, f.confidence);
    }
  const out: Suggestion[] = [];
  for (const m of MARKER_COMPOUNDS) {
    const hits = m.markers.filter((x) => found.has(norm(x)));
    if (!hits.length) continue;
    const confidence = hits.some((h) => found.get(norm(h)) === 'confirmed') ? 'confirmed' : 'probable';
    out.push({ name: m.dyestuff, kind: 'dyestuff', markers: hits, confidence });
  }
  for (const [el, name] of Object.entries(MORDANT_ELEMENTS)) {
    const c = found.get(norm(el));
    if (c === 'confirmed' || c === 'probable') out.push({ name, kind: 'mordant', markers: [el], confidence: c });
  }
  return out;
}
