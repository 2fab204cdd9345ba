import type { Writable } from 'node:stream';
import { csvStringifier } from './csv.ts';
import { Chemical, Piece, RecipeStep, Substitution, Trial, TrialSeries, User } from '../models/index.ts';
import type { Fastness } from '../../shared/schemas/fastness.ts';
import { trialColour, type ResolvedColour } from '../services/trials/colour.ts';
import { trialRecipeMass } from '../../shared/trials/quantities.ts';

// Colour columns: each colour with the illuminant and observer it is under, and the figures of
// the one comparison the trial page shows (target and result under the same illuminant).
const COLOUR_COLUMNS = [
  'targetSource',
  'targetIlluminant',
  'targetObserver',
  'targetL',
  'targetA',
  'targetB',
  'resultSource',
  'resultIlluminant',
  'resultObserver',
  'resultReadings',
  'resultL',
  'resultA',
  'resultB',
  'deltaE00',
  'cmc21',
  'cmc11',
  'deltaEab',
  'dL',
  'dC',
  'dH',
  'verdict',
  'colourNote',
] as const;
// Fastness grades as recorded: blue wool 1–8 for light (ISO 105-B02), grey scale 1–5 for the rest
// (change in colour ISO 105-A02, staining ISO 105-A03); which tests were informal is said beside them.
const FASTNESS_COLUMNS = [
  'lightBlueWool',
  'washChangeGrey',
  'washStainingGrey',
  'rubDryStainingGrey',
  'rubWetStainingGrey',
  'fastnessInformal',
  'fastnessTestedOn',
] as const;
const COLUMNS = [
  'code',
  'pieceAccessionNumber',
  'series',
  'status',
  'kind',
  'dyer',
  'fibre',
  'weave',
  'gsm',
  'dryMassG',
  // How the dry mass was weighed, and the air-dry (commercial) mass every % owf is of: oven-dry × (1 + regain),
  // ASTM D1909 regains recalled from memory (shared/data/moisture-regain.ts).
  'dryMassBasis',
  'airDryMassG',
  'moistureRegainPct',
  'startedOn',
  'recipe',
  'substitutions',
  ...COLOUR_COLUMNS,
  ...FASTNESS_COLUMNS,
  'notes',
] as const;

const n = (x: number | null | undefined, decimals: number) => (x == null ? '' : x.toFixed(decimals));
const colourCells = (prefix: 'target' | 'result', c: ResolvedColour | null) => ({
  [`${prefix}Source`]: c?.source ?? '',
  [`${prefix}Illuminant`]: c?.illuminant ?? '',
  [`${prefix}Observer`]: c ? `${c.observer}°` : '',
  [`${prefix}L`]: n(c?.L, 2),
  [`${prefix}A`]: n(c?.a, 2),
  [`${prefix}B`]: n(c?.b, 2),
});

const FASTNESS_TESTS = [
  ['light', 'light'],
  ['washing', 'washing'],
  ['rubbingDry', 'dry rubbing'],
  ['rubbingWet', 'wet rubbing'],
] as const;

function fastnessRow(f: Fastness | null) {
  const done = FASTNESS_TESTS.filter(([k]) => f?.[k]);
  return {
    lightBlueWool: f?.light?.blueWool ?? '',
    washChangeGrey: f?.washing?.change ?? '',
    washStainingGrey: f?.washing?.staining ?? '',
    rubDryStainingGrey: f?.rubbingDry?.staining ?? '',
    rubWetStainingGrey: f?.rubbingWet?.staining ?? '',
    fastnessInformal: done
      .filter(([k]) => f?.[k]?.informal)
      .map(([, word]) => word)
      .join('; '),
    fastnessTestedOn: done
      .map(([k, word]) => (f?.[k]?.testedOn ? `${word} ${f[k]!.testedOn}` : null))
      .filter(Boolean)
      .join('; '),
  };
}

async function colourRow(t: Trial) {
  const { target, result, difference: d, note, missing } = await trialColour(t);
  return {
    ...colourCells('target', target),
    ...colourCells('result', result),
    resultReadings: result?.readings ?? '',
    deltaE00: n(d?.deltaE00, 2),
    cmc21: n(d?.cmc21, 2),
    cmc11: n(d?.cmc11, 2),
    deltaEab: n(d?.deltaEab, 2),
    dL: n(d?.dL, 2),
    dC: n(d?.dC, 2),
    dH: n(d?.dH, 2),
    verdict: d?.verdict ?? '',
    colourNote: note ?? missing?.message ?? '',
  };
}

type Loaded = Trial & {
  piece?: Piece | null;
  series?: TrialSeries | null;
  dyer?: User | null;
  steps?: RecipeStep[];
  substitutions?: Array<Substitution & { historicalChemical?: Chemical | null; modernChemical?: Chemical | null }>;
};

const BASIS: Record<string, string> = { owf: '% owf', 'g/L': 'g/L', g: 'g' };

// A recipe step in one line, every quantity with its unit: "2. mordant-bath: potash alum 15 % owf; 1:30; 90 °C; 60 min".
function stepText(s: RecipeStep) {
  const parts = [s.ingredients.map((i) => `${i.name} ${i.amount} ${BASIS[i.basis] ?? i.basis}`).join(' + ')];
  if (s.liquorRatio != null) parts.push(`1:${s.liquorRatio}`);
  if (s.temperatureC != null) parts.push(`${s.temperatureC} °C`);
  if (s.minutes != null) parts.push(`${s.minutes} min`);
  if (s.ph != null) parts.push(`pH ${s.ph}`);
  return `${s.position}. ${s.operation}: ${parts.filter(Boolean).join('; ')}`;
}

function substitutionText(s: NonNullable<Loaded['substitutions']>[number]) {
  const from = s.historicalChemical?.name ?? s.historicalPractice ?? '?';
  const to = s.modernChemical?.name ?? s.modernPractice ?? '?';
  return `${from} → ${to} (${s.reason})`;
}

function massCells(t: Trial) {
  const m = trialRecipeMass(t);
  return { dryMassBasis: m.basis, airDryMassG: n(m.recipeMassG, 2), moistureRegainPct: m.regainPct ?? '' };
}

export async function writeTrialsCsv(out: Writable) {
  const csv = csvStringifier({ header: true, columns: [...COLUMNS] });
  csv.pipe(out);
  const trials = (await Trial.findAll({
    include: [
      { model: Piece, as: 'piece', attributes: ['accessionNumber'], paranoid: false },
      { model: TrialSeries, as: 'series', attributes: ['code'] },
      { model: User, as: 'dyer', attributes: ['name'] },
      { model: RecipeStep, as: 'steps' },
      {
        model: Substitution,
        as: 'substitutions',
        include: [
          { model: Chemical, as: 'historicalChemical', attributes: ['name'] },
          { model: Chemical, as: 'modernChemical', attributes: ['name'] },
        ],
      },
    ],
    order: [
      ['code', 'ASC'],
      [{ model: RecipeStep, as: 'steps' }, 'position', 'ASC'],
    ],
  })) as Loaded[];
  for (const t of trials) {
    csv.write({
      code: t.code,
      pieceAccessionNumber: t.piece?.accessionNumber ?? '',
      series: t.series?.code ?? '',
      status: t.status,
      kind: t.kind,
      dyer: t.dyer?.name ?? '',
      fibre: t.fibre ?? '',
      weave: t.weave ?? '',
      gsm: t.gsm ?? '',
      dryMassG: t.dryMassG,
      ...massCells(t),
      startedOn: t.startedOn ?? '',
      recipe: (t.steps ?? []).map(stepText).join(' | '),
      substitutions: (t.substitutions ?? []).map(substitutionText).join(' | '),
      ...(await colourRow(t)),
      ...fastnessRow((t.fastness ?? null) as Fastness | null),
      notes: t.notes ?? '',
    });
  }
  csv.end();
  await new Promise((resolve, reject) => out.on('finish', resolve).on('error', reject));
}
