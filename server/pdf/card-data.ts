import { Op } from 'sequelize';
import { labToHex, type Lab } from '../../shared/colour/index.ts';
import { RecipeStep, Trial } from '../models/index.ts';
import { publicUrl } from '../env.ts';
import { trialColour } from '../services/trials/colour.ts';

export type CardColour = Lab & { hex: string; source: 'measured' | 'estimated' };
export type CardData = {
  id: number; code: string; status: string; dryMassG: number; fibre: string | null; cell: Record<string, string> | null;
  steps: string[]; colour: CardColour | null; target: (Lab & { hex: string }) | null; deltaE00: number | null; verdict: string | null; words: string[]; url: string;
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
    const { target, result, difference } = await trialColour(t);
    const steps = ((t as Trial & { steps?: RecipeStep[] }).steps ?? []).sort((a, b) => a.position - b.position).map(stepLine);
    out.push({
      id: t.id, code: t.code, status: t.status, dryMassG: t.dryMassG, fibre: t.fibre, cell: t.cell, steps,
      colour: result ? { L: result.L, a: result.a, b: result.b, hex: labToHex(result), source: result.source === 'instrument' ? 'measured' : 'estimated' } : null,
      target: target ? { L: target.L, a: target.a, b: target.b, hex: labToHex(target) } : null,
      deltaE00: difference ? Math.round(difference.deltaE00 * 100) / 100 : null,
      verdict: difference?.verdict ?? null,
      words: difference?.words ?? [],
      url: trialUrl(t.id),
    });
  }
  return out;
}
