import { Op } from 'sequelize';
import { labToHex, type Lab } from '../../shared/colour/index.ts';
import { viewingLabel } from '../../shared/colour/conditions.ts';
import { RecipeStep, Trial } from '../models/index.ts';
import { publicUrl } from '../env.ts';
import { trialColour } from '../services/trials/colour.ts';

/** `conditions` is the shared viewing-conditions label, e.g. "instrument reading · D65/10°". */
export type CardColour = Lab & { hex: string; source: 'measured' | 'estimated'; conditions: string; readings: number | null };
export type CardData = {
  id: number; code: string; status: string; dryMassG: number; fibre: string | null; cell: Record<string, string> | null;
  steps: string[]; colour: CardColour | null; target: (Lab & { hex: string; conditions: string }) | null;
  deltaE00: number | null; cmc21: number | null; dL: number | null; dC: number | null; dH: number | null;
  verdict: string | null; words: string[];
  /** The observer note, or which reading is missing when no ΔE00 can be given. */
  note: string | null;
  url: string;
};

export const trialUrl = (id: number) => `${publicUrl.replace(/\/$/, '')}/trials/${id}`;

function stepLine(s: RecipeStep) {
  const ing = s.ingredients.map((i) => `${i.name} ${i.amount} ${i.basis === 'owf' ? '% owf' : i.basis}`).join(', ');
  const cond = [s.liquorRatio ? `1:${s.liquorRatio}` : null, s.temperatureC != null ? `${s.temperatureC} °C` : null, s.minutes != null ? `${s.minutes} min` : null].filter(Boolean).join(', ');
  return `${s.position}. ${s.operation}${ing ? `: ${ing}` : ''}${cond ? ` (${cond})` : ''}`;
}

/** What a sample card shows, with colours and ΔE00 resolved exactly as on the trial page (services/trials/colour.ts). */
export async function loadCards(trialIds: number[]): Promise<CardData[]> {
  const trials = await Trial.findAll({ where: { id: { [Op.in]: trialIds } }, include: [{ model: RecipeStep, as: 'steps' }], order: [['code', 'ASC']] });
  const out: CardData[] = [];
  for (const t of trials) {
    const { target, result, difference, note, missing } = await trialColour(t);
    const steps = ((t as Trial & { steps?: RecipeStep[] }).steps ?? []).sort((a, b) => a.position - b.position).map(stepLine);
    out.push({
      id: t.id, code: t.code, status: t.status, dryMassG: t.dryMassG, fibre: t.fibre, cell: t.cell, steps,
      colour: result
        ? { L: result.L, a: result.a, b: result.b, hex: labToHex(result), source: result.source === 'instrument' ? 'measured' : 'estimated', conditions: viewingLabel(result), readings: result.readings }
        : null,
      target: target ? { L: target.L, a: target.a, b: target.b, hex: labToHex(target), conditions: viewingLabel(target) } : null,
      deltaE00: difference ? Math.round(difference.deltaE00 * 100) / 100 : null,
      cmc21: difference?.cmc21 ?? null, dL: difference?.dL ?? null, dC: difference?.dC ?? null, dH: difference?.dH ?? null,
      // Short forms of the page's note: a card has room for one line.
      note: note && target && result ? `observers differ: target ${target.observer}°, swatch ${result.observer}° (both ${target.illuminant})` : missing ? `no ΔE00: no reading of the swatch under ${missing.illuminant}` : null,
      verdict: difference?.verdict ?? null,
      words: difference?.words ?? [],
      url: trialUrl(t.id),
    });
  }
  return out;
}
