import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { outsideUsualRange, thickenerRange } from '../../shared/compute/thickeners.ts';

// Reference ranges: tests/reference/dye-facts.json (guar, sodium alginate, gum arabic in % w/w, common practice,
// no published source; read as g per 100 g of paste, ×10 for g/L at about 1 kg/L) and
// tests/reference/thickener-ranges.json (tragacanth, starch, British gum in g/L, common practice, recalled from memory).
type Fact = { topic?: string; parameter?: string; range?: [number, number]; unit?: string; notes?: string[] };
const read = (f: string) => JSON.parse(readFileSync(new URL(`../reference/${f}`, import.meta.url), 'utf8')) as Fact[];
const facts = read('dye-facts.json').filter((f) => f.topic === 'printing thickener');
const memory = read('thickener-ranges.json');
const fact = (list: Fact[], word: string) => list.find((f) => f.parameter?.includes(word))!;

describe('print-paste thickeners by kind', () => {
  it('guar and gum arabic as dye-facts.json gives them (% w/w × 10 = g/L)', () => {
    for (const [name, word] of [
      ['guar gum', 'guar'],
      ['gum arabic', 'gum arabic'],
    ] as const) {
      const f = fact(facts, word);
      expect(f.unit).toBe('% w/w');
      expect(thickenerRange(name)).toMatchObject({ min: f.range![0] * 10, max: f.range![1] * 10 });
    }
  });

  it('sodium alginate as the note beside guar in dye-facts.json gives it (2–4 %)', () => {
    expect(fact(facts, 'guar').notes?.join(' ')).toMatch(/sodium alginate similar range \(2-4 %\)/);
    expect(thickenerRange('sodium alginate')).toMatchObject({ min: 20, max: 40 });
  });

  it('tragacanth, wheat starch and British gum as recalled (common practice, from memory)', () => {
    for (const [name, word] of [
      ['gum tragacanth', 'tragacanth'],
      ['wheat starch', 'wheat starch'],
      ['British gum (dextrin)', 'British gum'],
    ] as const) {
      const f = fact(memory, word);
      expect(thickenerRange(name)).toMatchObject({ min: f.range![0], max: f.range![1] });
      expect(thickenerRange(name)?.source).toMatch(/recalled from memory/);
    }
  });

  it('gum arabic is used far thicker than guar; a weak gum is matched before the starch it is made from', () => {
    expect(thickenerRange('gum arabic')!.min).toBeGreaterThan(thickenerRange('guar gum')!.max);
    expect(thickenerRange('British gum (dextrin)')?.kind).toBe('british-gum');
    expect(outsideUsualRange('gum arabic', 300)).toBe(false);
    expect(outsideUsualRange('guar gum', 300)).toBe(true);
    expect(outsideUsualRange('locust bean gum', 10)).toBeNull();
  });
});
