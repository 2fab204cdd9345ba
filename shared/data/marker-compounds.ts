/**
 * Marker compounds of dyestuffs: a finding of one of these (confirmed or probable) suggests the dyestuff.
 * Principal colorants: Colour Index International (SDC/AATCC), recalled from memory (the same values as
 * server/seed/data/dyestuffs.json). Minor markers (pseudopurpurin in madder, indirubin in indigo and woad,
 * ellagic acid for gall and other ellagitannin sources): recalled from memory, common practice in HPLC reports.
 * Check values: tests/reference/marker-compounds.json.
 */
export const COLORANTS = [
  'alizarin',
  'purpurin',
  'pseudopurpurin',
  'munjistin',
  'indigotin',
  'indirubin',
  'luteolin',
  'apigenin',
  'carminic acid',
  'kermesic acid',
  'laccaic acid A',
  'ellagic acid',
  'brazilin',
  'haematoxylin',
  'morin',
  'quercetin',
  'curcumin',
  'carthamin',
] as const;

export const ELEMENTS = ['Al', 'Fe', 'Sn', 'Cr', 'Pb', 'Cu', 'Ca', 'K', 'S', 'Zn', 'As', 'Hg'] as const;

export type MarkerEntry = { dyestuff: string; markers: string[]; source: string };

const CI = 'Colour Index International (SDC/AATCC), principal colorants, recalled from memory';
const MINOR = 'recalled from memory (common practice in dye analysis)';

export const MARKER_COMPOUNDS: MarkerEntry[] = [
  {
    dyestuff: 'madder',
    markers: ['alizarin', 'purpurin', 'pseudopurpurin', 'munjistin'],
    source: `${CI}; pseudopurpurin and munjistin ${MINOR}`,
  },
  { dyestuff: 'indigo', markers: ['indigotin', 'indirubin'], source: `${CI}; indirubin ${MINOR}` },
  { dyestuff: 'woad', markers: ['indigotin', 'indirubin'], source: `${CI}; indirubin ${MINOR}` },
  { dyestuff: 'weld', markers: ['luteolin', 'apigenin'], source: CI },
  { dyestuff: 'cochineal', markers: ['carminic acid'], source: CI },
  { dyestuff: 'kermes', markers: ['kermesic acid'], source: CI },
  { dyestuff: 'lac', markers: ['laccaic acid A'], source: CI },
  { dyestuff: 'brazilwood / sappanwood', markers: ['brazilin'], source: CI },
  { dyestuff: 'logwood', markers: ['haematoxylin'], source: CI },
  { dyestuff: 'old fustic', markers: ['morin'], source: CI },
  { dyestuff: 'turmeric', markers: ['curcumin'], source: CI },
  { dyestuff: 'safflower', markers: ['carthamin'], source: CI },
  { dyestuff: 'gall nuts (tannin)', markers: ['ellagic acid'], source: MINOR },
];

/** Mordant metals a finding of an element points to (recalled from memory, common practice). */
export const MORDANT_ELEMENTS: Record<string, string> = {
  Al: 'aluminium (alum)',
  Fe: 'iron',
  Sn: 'tin',
  Cr: 'chromium',
  Cu: 'copper',
  Pb: 'lead',
};
