import { z } from 'zod';

// Every validation message a person reads comes from a schema's own words or from here, never from
// zod's built-in English ("Invalid input: expected string, received null"). installMessages() runs
// once on each side: server/app.ts and client/main.tsx (and tests/support/messages.ts for unit tests).

type Label = { label: string; unit?: string };

/** What each field is called in a sentence, by the last key of its path (the same key the forms use). */
export const FIELD_LABELS: Record<string, Label> = {
  // people and access
  email: { label: 'the e-mail address' },
  password: { label: 'the password' },
  name: { label: 'the name' },
  role: { label: 'a role' },
  active: { label: 'active or not' },
  token: { label: 'the link' },
  // pieces
  accessionNumber: { label: 'the accession number' },
  title: { label: 'the title' },
  objectName: { label: 'the object name' },
  dateText: { label: 'the date as written' },
  dateEdtf: { label: 'the EDTF date' },
  earliestYear: { label: 'the earliest year' },
  latestYear: { label: 'the latest year' },
  place: { label: 'the place' },
  evidence: { label: 'attributed or identified' },
  widthMm: { label: 'the width', unit: 'mm' },
  heightMm: { label: 'the height', unit: 'mm' },
  repeatWidthMm: { label: 'the repeat width', unit: 'mm' },
  repeatHeightMm: { label: 'the repeat height', unit: 'mm' },
  makers: { label: 'the makers' },
  dates: { label: 'the dates (EDTF)' },
  patternName: { label: 'the pattern name' },
  marks: { label: 'the marks and inscriptions' },
  text: { label: 'the text' },
  storageLocation: { label: 'the storage location' },
  objectRights: { label: 'the object rights' },
  imageRights: { label: 'the image rights' },
  // trials and recipes
  status: { label: 'a status' },
  kind: { label: 'a kind' },
  fibre: { label: 'the fibre' },
  weave: { label: 'the weave' },
  gsm: { label: 'the fabric weight', unit: 'g/m²' },
  dryMassG: { label: 'the dry fibre mass', unit: 'g' },
  dryMassBasis: { label: 'air-dry or oven-dry' },
  targetAim: { label: 'as made or as seen' },
  historicalUseConfirmed: { label: 'the confirmation of a historical-only chemical' },
  historicalUseReason: { label: 'the reason for using a historical-only chemical' },
  notes: { label: 'the notes' },
  startedOn: { label: 'the start date' },
  pieceId: { label: 'the piece' },
  operation: { label: 'an operation' },
  refId: { label: 'an ingredient' },
  amount: { label: 'the amount' },
  basis: { label: 'the basis (% owf, g/L or g)' },
  liquorRatio: { label: 'the liquor ratio' },
  temperatureC: { label: 'the temperature', unit: '°C' },
  minutes: { label: 'the time', unit: 'min' },
  ph: { label: 'the pH' },
  batchId: { label: 'the bath' },
  batchVolumeMl: { label: 'the volume drawn', unit: 'mL' },
  stockGPerL: { label: 'the stock strength', unit: 'g/L' },
  reason: { label: 'a reason' },
  illuminant: { label: 'an illuminant' },
  observer: { label: 'an observer' },
  takenOn: { label: 'the date measured' },
  instrument: { label: 'the instrument' },
  geometry: { label: 'a measuring geometry' },
  specular: { label: 'a specular setting (SCI or SCE)' },
  stepId: { label: 'a step' },
  historicalChemicalId: { label: 'a historical chemical' },
  modernChemicalId: { label: 'a modern chemical' },
  historicalAmountG: { label: 'the historical amount', unit: 'g' },
  modernAmountG: { label: 'the modern amount', unit: 'g' },
  // fastness grades
  blueWool: { label: 'a blue wool grade' },
  change: { label: 'a grade for the change in colour' },
  staining: { label: 'a grade for the staining' },
  testedOn: { label: 'the date tested' },
  // baths
  code: { label: 'the code' },
  volumeMl: { label: 'the volume', unit: 'mL' },
  madeOn: { label: 'the date it was made' },
  checkBy: { label: 'the check-by date' },
  thickenerGPerL: { label: 'the thickener', unit: 'g/L' },
  uptakePerUse: { label: 'the uptake per use' },
  grams: { label: 'the amount', unit: 'g' },
  fibreMassG: { label: 'the fibre mass', unit: 'g' },
  trialCode: { label: 'the trial code' },
  result: { label: 'what the strip showed' },
  route: { label: 'how it was disposed of' },
  ruleFollowed: { label: 'the rule followed' },
  ingredients: { label: 'the ingredients' },
  additions: { label: 'the additions' },
  // reference (chemicals and dyestuffs)
  formula: { label: 'the formula' },
  metal: { label: 'the metal' },
  signalWord: { label: 'a signal word' },
  hStatements: { label: 'the H statements' },
  ppe: { label: 'the protection' },
  caution: { label: 'the caution' },
  source: { label: 'where the data come from' },
  hazardSource: { label: 'the source of the hazard data' },
  hazardBasis: { label: 'a basis for the hazard data' },
  ciName: { label: 'the C.I. generic name' },
  colorants: { label: 'the colorants' },
  species: { label: 'the species' },
  dyeClass: { label: 'the dye class' },
  // photos and regions
  caption: { label: 'the caption' },
  view: { label: 'a view' },
  purpose: { label: 'a purpose for the region' },
  label: { label: 'the label' },
  // series
  factors: { label: 'the factors' },
  levels: { label: 'the levels' },
  level: { label: 'the level name' },
  owf: { label: 'the amount', unit: '% owf' },
  participants: { label: 'the participant codes' },
  deadVolumePct: { label: 'the dead-volume allowance', unit: '%' },
  heldOn: { label: 'the date it is held' },
  // shade search
  hex: { label: 'the hex colour' },
  L: { label: 'L*' },
  a: { label: 'a*' },
  b: { label: 'b*' },
  maxDeltaE: { label: 'the radius', unit: 'ΔE00' },
  q: { label: 'the words' },
  page: { label: 'the page number' },
  pageSize: { label: 'the page size' },
  limit: { label: 'the number of results' },
  // analyses, condition reports, display periods (issue 19)
  analysisId: { label: 'the analysis' },
  method: { label: 'a method' },
  regionId: { label: 'the region' },
  site: { label: 'the sample or site' },
  laboratory: { label: 'the laboratory' },
  analyst: { label: 'the analyst' },
  analysedOn: { label: 'the date analysed' },
  findings: { label: 'the findings' },
  substance: { label: 'the colorant or element' },
  confidence: { label: 'a confidence' },
  report: { label: 'the report' },
  assessedOn: { label: 'the date assessed' },
  assessor: { label: 'the assessor' },
  state: { label: 'the overall state' },
  photoIds: { label: 'the photos' },
  regionIds: { label: 'the regions' },
  from: { label: 'the first day' },
  to: { label: 'the last day' },
  lux: { label: 'the illuminance', unit: 'lux' },
  hoursPerDay: { label: 'the hours lit a day', unit: 'h' },
  uvMicrowattsPerLumen: { label: 'the UV', unit: 'µW/lm' },
  confirm: { label: 'the confirmation' },
  // list filters
  sort: { label: 'a sort order' },
  dir: { label: 'a direction' },
  deleted: { label: 'an option for deleted pieces' },
  mine: { label: 'a filter for your own trials' },
};

/** The words for the field at `path`: its own label, or, for a row in a list, the list's. */
export function fieldLabel(path: ReadonlyArray<PropertyKey>): Label {
  for (let i = path.length - 1; i >= 0; i--) {
    const key = path[i];
    if (typeof key === 'string' && FIELD_LABELS[key]) return FIELD_LABELS[key];
    if (typeof key === 'string' && !/^\d+$/.test(key)) return { label: humanise(key) };
  }
  return { label: 'this value' };
}

// camelCase keys not in the table still read as words ("modernPractice" → "the modern practice").
const humanise = (key: string) => `the ${key.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase()}`;
const cap = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);
const fmt = (n: number | bigint) =>
  typeof n === 'bigint' ? n.toString() : n.toLocaleString('en-GB', { maximumFractionDigits: 6 });
const withUnit = (n: number | bigint, unit?: string) =>
  `${fmt(n)}${unit ? (unit.startsWith('%') ? ` ${unit}` : ` ${unit}`) : ''}`;
// "Choose a role", "Enter the volume": a label starting with "a"/"an" is chosen, the rest entered.
const isChoice = (label: string) =>
  /^(a|an) /.test(label) || label === 'attributed or identified' || label === 'active or not';
const enter = ({ label, unit }: Label) =>
  isChoice(label) ? `Choose ${label}` : `Enter ${label}${unit ? ` in ${unit}` : ''}`;
const listLabel = (values: ReadonlyArray<unknown>) =>
  values.slice(0, 8).map(String).join(', ') + (values.length > 8 ? ', …' : '');
// NaN is what Number('') and an empty number input give: nothing was typed.
const isEmpty = (v: unknown) =>
  v === undefined || v === null || Number.isNaN(v) || (typeof v === 'string' && v.trim() === '');

/** One issue in people's words, using the field's label. Exported for the unit test. */
export function messageFor(issue: z.core.$ZodRawIssue): string {
  const f = fieldLabel(issue.path ?? []);
  const L = cap(f.label);
  switch (issue.code) {
    case 'invalid_type': {
      if (isEmpty(issue.input) || issue.expected === 'nonoptional') return enter(f);
      if (issue.expected === 'int' && typeof issue.input === 'number' && Number.isFinite(issue.input))
        return isChoice(f.label) ? `Choose ${f.label}` : `${L} must be a whole number`;
      if (issue.expected === 'number' || issue.expected === 'int' || issue.expected === 'bigint')
        return `Enter ${f.label} as a number${f.unit ? ` in ${f.unit}` : ''}`;
      if (issue.expected === 'date') return 'Enter a date such as 2024-03-12';
      if (issue.expected === 'boolean' || issue.expected === 'array' || issue.expected === 'object')
        return isChoice(f.label) ? `Choose ${f.label}` : `Check ${f.label}: it is not in a form this page understands`;
      return enter(f);
    }
    case 'too_small': {
      const min = issue.minimum;
      if (issue.origin === 'string')
        return Number(min) <= 1 || isEmpty(issue.input)
          ? enter(f)
          : `Use at least ${fmt(min)} characters for ${f.label}`;
      if (issue.origin === 'array' || issue.origin === 'set')
        return Number(min) <= 1
          ? `Add at least one entry to ${f.label}`
          : `Add at least ${fmt(min)} entries to ${f.label}`;
      if (issue.origin === 'date') return `${L} must not be before ${String(min)}`;
      if (isChoice(f.label)) return `Choose ${f.label}`; // an id of 0: nothing chosen
      return issue.inclusive
        ? `${L} must be ${withUnit(min, f.unit)} or more`
        : `${L} must be more than ${withUnit(min, f.unit)}`;
    }
    case 'too_big': {
      const max = issue.maximum;
      if (issue.origin === 'string') return `Use at most ${fmt(max)} characters for ${f.label}`;
      if (issue.origin === 'array' || issue.origin === 'set') return `${L} can have at most ${fmt(max)} entries`;
      if (issue.origin === 'date') return `${L} must not be after ${String(max)}`;
      return issue.inclusive
        ? `${L} must be ${withUnit(max, f.unit)} or less`
        : `${L} must be less than ${withUnit(max, f.unit)}`;
    }
    case 'invalid_format': {
      if (issue.format === 'email') return 'Enter an e-mail address such as name@example.org';
      if (issue.format === 'date') return 'Enter a date such as 2024-03-12';
      if (issue.format === 'datetime') return 'Enter a date and time such as 2024-03-12T14:30:00Z';
      if (issue.format === 'url') return 'Enter a web address such as https://example.org';
      return `Check ${f.label}: it is not written the way it should be`;
    }
    case 'invalid_value':
      return issue.values.length === 1
        ? `${L} must be ${String(issue.values[0])}`
        : `Choose ${isChoice(f.label) ? f.label : `one of ${f.label}`}: ${listLabel(issue.values)}`;
    case 'not_multiple_of':
      return `${L} must be a multiple of ${fmt(issue.divisor)}`;
    case 'unrecognized_keys':
      return `Leave out ${issue.keys.length === 1 ? 'the field' : 'the fields'} this form does not have: ${issue.keys.join(', ')}`;
    case 'invalid_union':
    case 'invalid_key':
    case 'invalid_element':
      return `Check ${f.label}: it is not in a form this page understands`;
    case 'custom':
    default:
      return `Check ${f.label}`;
  }
}

let installed = false;
/** Make zod speak in these words wherever a schema gives none of its own. Safe to call more than once. */
export function installMessages() {
  if (installed) return;
  installed = true;
  z.config({ customError: (issue) => messageFor(issue) });
}
installMessages();
