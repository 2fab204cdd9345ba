import { Op } from 'sequelize';
import { labToHex, type Lab } from '../../shared/colour/index.ts';
import { viewingLabel } from '../../shared/colour/conditions.ts';
import { gramsFromOwf } from '../../shared/compute/recipe.ts';
import { trialRecipeMass } from '../../shared/trials/quantities.ts';
import { incompatibleInStep } from '../../shared/compute/incompatible.ts';
import { Chemical, RecipeStep, Trial, TrialSeries } from '../models/index.ts';
import { roleOf, type StoredFactor } from '../services/series/plan.ts';
import { publicUrl } from '../env.ts';
import { trialColour } from '../services/trials/colour.ts';

/** `conditions` is the shared viewing-conditions label, e.g. "instrument reading · D65/10°". */
export type CardColour = Lab & {
  hex: string;
  source: 'measured' | 'estimated';
  conditions: string;
  readings: number | null;
};
export type CardData = {
  id: number;
  code: string;
  status: string;
  dryMassG: number;
  fibre: string | null;
  /** The dry mass in words with its basis, e.g. "100 g dry mass (oven-dry) = 114 g air-dry (wool, 13.6 % regain, ASTM D1909)". */
  massLine: string;
  /** The series cell in words, each level with its unit. */
  cell: string | null;
  steps: string[];
  colour: CardColour | null;
  target: (Lab & { hex: string; conditions: string }) | null;
  deltaE00: number | null;
  cmc21: number | null;
  dL: number | null;
  dC: number | null;
  dH: number | null;
  verdict: string | null;
  words: string[];
  /** The observer note, or which reading is missing when no ΔE00 can be given. */
  note: string | null;
  url: string;
};

export const trialUrl = (id: number) => `${publicUrl.replace(/\/$/, '')}/trials/${id}`;

const fmtNum = (x: number) => String(Number(x.toPrecision(3)));
const BASIS: Record<string, string> = { owf: '% owf', 'g/L': 'g/L', g: 'g' };

// Every quantity with its unit; % owf amounts also in grams for the card's dry mass, as weighed out;
// a print paste's g/L as g/L of paste and in grams for the paste volume (never % owf).
function stepLine(s: RecipeStep, dryMassG: number) {
  const v = Number(s.paste?.volumeMl);
  const pasteMl = s.operation === 'print-paste' && v > 0 ? v : null;
  const grams = (i: RecipeStep['ingredients'][number]) => {
    if (i.basis === 'owf') return ` = ${fmtNum(gramsFromOwf(i.amount, dryMassG))} g`;
    if (i.basis === 'g/L' && pasteMl)
      return ` of paste = ${fmtNum((i.amount * pasteMl) / 1000)} g in ${fmtNum(pasteMl)} mL`;
    if (i.basis === 'g/L' && s.operation === 'print-paste') return ' of paste';
    return '';
  };
  const ing = s.ingredients.map((i) => `${i.name} ${i.amount} ${BASIS[i.basis] ?? i.basis}${grams(i)}`).join(', ');
  const cond = [
    s.liquorRatio ? `liquor 1:${s.liquorRatio}` : null,
    s.temperatureC != null ? `${s.temperatureC} °C` : null,
    s.minutes != null ? `${s.minutes} min` : null,
    s.ph != null ? `pH ${s.ph}` : null,
    s.batchVolumeMl != null ? `${s.batchVolumeMl} mL from the bath` : null,
  ]
    .filter(Boolean)
    .join(', ');
  return `${s.position}. ${s.operation}${ing ? `: ${ing}` : ''}${cond ? ` (${cond})` : ''}`;
}

/** A series cell in words with units: "tannin 10 % owf", "mordant strong Al (potash alum 15 % owf)". */
function cellLine(cell: Record<string, string>, factors: StoredFactor[]) {
  return Object.entries(cell)
    .map(([k, v]) => {
      const f = factors.find((x) => x.name === k);
      if (!f) return `${k} ${v}`;
      const role = roleOf(f);
      if ((role === 'dyestuff' || role === 'tannin') && Number.isFinite(Number(v))) return `${k} ${v} % owf`;
      const chems = f.mordants?.find((m) => m.level === v)?.chemicals;
      return chems?.length ? `${k} ${v} (${chems.map((c) => `${c.name} ${c.owf} % owf`).join(' + ')})` : `${k} ${v}`;
    })
    .join(' · ');
}

/** What a sample card shows, with colours and ΔE00 resolved exactly as on the trial page (services/trials/colour.ts). */
export async function loadCards(trialIds: number[]): Promise<CardData[]> {
  const trials = await Trial.findAll({
    where: { id: { [Op.in]: trialIds } },
    include: [
      { model: RecipeStep, as: 'steps' },
      { model: TrialSeries, as: 'series', attributes: ['id', 'factors'] },
    ],
    order: [['code', 'ASC']],
  });
  const out: CardData[] = [];
  for (const t of trials) {
    const { target, result, difference, note, missing } = await trialColour(t);
    // Grams are weighed out on the air-dry mass: an oven-dry mass is brought to it with the fibre's regain.
    const mass = trialRecipeMass(t);
    const stepRows = ((t as Trial & { steps?: RecipeStep[] }).steps ?? []).sort((a, b) => a.position - b.position);
    // A dangerous mix goes on the card under its step: the card is what stands beside the pot.
    const chemIds = [
      ...new Set(stepRows.flatMap((s) => s.ingredients.filter((i) => i.kind === 'chemical').map((i) => i.refId))),
    ];
    const chems = new Map(
      (chemIds.length
        ? await Chemical.findAll({ where: { id: chemIds }, attributes: ['id', 'name', 'formula', 'role'] })
        : []
      ).map((c) => [c.id, c]),
    );
    const steps = stepRows.flatMap((s) => {
      const inStep = [...new Set(s.ingredients.filter((i) => i.kind === 'chemical').map((i) => i.refId))]
        .map((id) => chems.get(id))
        .filter((c): c is Chemical => Boolean(c));
      const mixes = incompatibleInStep(
        s.position,
        inStep.map((c) => ({ id: c.id, name: c.name, formula: c.formula, role: c.role })),
      );
      return [
        stepLine(s, mass.recipeMassG),
        ...mixes.map((w) => `   DANGER: ${w.message} Check the safety data sheets.`),
      ];
    });
    const massLine =
      mass.basis === 'oven-dry' && mass.regainPct != null
        ? `${fmtNum(mass.enteredG)} g dry mass (oven-dry) = ${fmtNum(mass.recipeMassG)} g air-dry (${mass.fibre}, ${mass.regainPct} % regain, ASTM D1909)`
        : `${fmtNum(mass.enteredG)} g dry mass (${mass.basis})`;
    const series = (t as Trial & { series?: TrialSeries | null }).series;
    out.push({
      id: t.id,
      code: t.code,
      status: t.status,
      dryMassG: t.dryMassG,
      massLine,
      fibre: t.fibre,
      cell: t.cell ? cellLine(t.cell, series ? (series.factors as StoredFactor[]) : []) : null,
      steps,
      colour: result
        ? {
            L: result.L,
            a: result.a,
            b: result.b,
            hex: labToHex(result),
            source: result.source === 'instrument' ? 'measured' : 'estimated',
            conditions: viewingLabel(result),
            readings: result.readings,
          }
        : null,
      target: target
        ? { L: target.L, a: target.a, b: target.b, hex: labToHex(target), conditions: viewingLabel(target) }
        : null,
      deltaE00: difference ? Math.round(difference.deltaE00 * 100) / 100 : null,
      cmc21: difference?.cmc21 ?? null,
      dL: difference?.dL ?? null,
      dC: difference?.dC ?? null,
      dH: difference?.dH ?? null,
      // Short forms of the page's note: a card has room for one line.
      note:
        note && target && result
          ? `observers differ: target ${target.observer}°, swatch ${result.observer}° (both ${target.illuminant})`
          : missing
            ? `no ΔE00: no reading of the swatch under ${missing.illuminant}`
            : null,
      verdict: difference?.verdict ?? null,
      words: difference?.words ?? [],
      url: trialUrl(t.id),
    });
  }
  return out;
}
