import Color from 'colorjs.io';
import { Op } from 'sequelize';
import { ColourMeasurement, PaletteColour, Photo, RecipeStep, Trial } from '../models/index.ts';
import { publicUrl } from '../env.ts';

export type Lab = { L: number; a: number; b: number };
export type CardColour = Lab & { hex: string; source: 'measured' | 'estimated' };
export type CardData = {
  id: number; code: string; status: string; dryMassG: number; fibre: string | null; cell: Record<string, string> | null;
  steps: string[]; colour: CardColour | null; target: (Lab & { hex: string }) | null; deltaE00: number | null; url: string;
};

// Stored CIELAB is D65; sRGB for drawing is gamut-mapped. ΔE00 is computed on the
// raw L*a*b* values (colorjs.io gives the Sharma et al. 2005 test values this way).
const hexOf = (c: Lab) => new Color('lab-d65', [c.L, c.a, c.b]).to('srgb').toGamut().toString({ format: 'hex', collapse: false });
const de00 = (ref: Lab, x: Lab) => new Color('lab', [ref.L, ref.a, ref.b]).deltaE2000(new Color('lab', [x.L, x.a, x.b]));

export const trialUrl = (id: number) => `${publicUrl.replace(/\/$/, '')}/trials/${id}`;

function stepLine(s: RecipeStep) {
  const ing = s.ingredients.map((i) => `${i.name} ${i.amount} ${i.basis === 'owf' ? '% owf' : i.basis}`).join(', ');
  const cond = [s.liquorRatio ? `1:${s.liquorRatio}` : null, s.temperatureC != null ? `${s.temperatureC} °C` : null, s.minutes != null ? `${s.minutes} min` : null].filter(Boolean).join(', ');
  return `${s.position}. ${s.operation}${ing ? `: ${ing}` : ''}${cond ? ` (${cond})` : ''}`;
}

export async function loadCards(trialIds: number[]): Promise<CardData[]> {
  const trials = await Trial.findAll({ where: { id: { [Op.in]: trialIds } }, include: [{ model: RecipeStep, as: 'steps' }], order: [['code', 'ASC']] });
  const out: CardData[] = [];
  for (const t of trials) {
    const measured = await ColourMeasurement.findOne({ where: { trialId: t.id }, order: [['createdAt', 'DESC']] });
    let colour: CardColour | null = measured ? { L: measured.L, a: measured.a, b: measured.b, hex: hexOf(measured), source: 'measured' } : null;
    if (!colour) {
      const photo = await Photo.findOne({ where: { trialId: t.id }, attributes: ['id'], order: [['id', 'DESC']] });
      const est = photo ? await PaletteColour.findOne({ where: { photoId: photo.id, background: false }, order: [['variant', 'ASC'], ['rank', 'ASC']] }) : null;
      if (est) colour = { L: est.L, a: est.a, b: est.b, hex: est.hex, source: 'estimated' };
    }
    const tm = t.targetMeasurementId ? await ColourMeasurement.findByPk(t.targetMeasurementId) : null;
    const tp = !tm && t.targetPaletteColourId ? await PaletteColour.findByPk(t.targetPaletteColourId) : null;
    const tLab = tm ?? tp;
    const target = tLab ? { L: tLab.L, a: tLab.a, b: tLab.b, hex: hexOf(tLab) } : null;
    const steps = ((t as Trial & { steps?: RecipeStep[] }).steps ?? []).sort((a, b) => a.position - b.position).map(stepLine);
    out.push({
      id: t.id, code: t.code, status: t.status, dryMassG: t.dryMassG, fibre: t.fibre, cell: t.cell, steps, colour, target,
      deltaE00: colour && target ? Math.round(de00(target, colour) * 100) / 100 : null, url: trialUrl(t.id),
    });
  }
  return out;
}
