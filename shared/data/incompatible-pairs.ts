// Chemicals that must not meet in one bath or paste, and what happens if they do.
// Each pair names its source; "recalled from memory" means it was not read in a stored copy:
// always defer to the supplier's safety data sheet and local rules.

export type ChemicalGroup =
  | 'reducer'
  | 'acid'
  | 'oxidiser'
  | 'hypochlorite'
  | 'arsenic'
  | 'quicklime'
  | 'strong-alkali'
  | 'aluminium-metal'
  | 'water';

export const GROUP_LABELS: Record<ChemicalGroup, string> = {
  reducer: 'a reducer',
  acid: 'an acid',
  oxidiser: 'an oxidiser',
  hypochlorite: 'a hypochlorite (bleach)',
  arsenic: 'an arsenic compound',
  quicklime: 'quicklime',
  'strong-alkali': 'a strong alkali',
  'aluminium-metal': 'aluminium metal',
  water: 'water',
};

/** Formulas (spaces removed) that put a chemical in a group whatever its role in the reference list. */
export const GROUP_FORMULAS: Record<ChemicalGroup, readonly string[]> = {
  reducer: ['Na2S2O4', 'CH4N2O2S'],
  // Cream of tartar is an acid salt: it acidifies a bath as an acid does.
  acid: ['CH3COOH', 'C2H2O4', 'C2H2O4·2H2O', 'KC4H5O6', 'C6H8O7', 'HCl', 'H2SO4'],
  oxidiser: ['K2Cr2O7', 'Na2Cr2O7', 'KMnO4', 'H2O2', 'NaClO', 'NaOCl', 'Ca(ClO)2', 'Ca(OCl)2'],
  hypochlorite: ['NaClO', 'NaOCl', 'Ca(ClO)2', 'Ca(OCl)2'],
  arsenic: [],
  quicklime: ['CaO'],
  'strong-alkali': ['NaOH', 'KOH', 'CaO'],
  'aluminium-metal': ['Al'],
  water: [],
};

/** A reference role that alone puts a chemical in a group. */
export const GROUP_ROLES: Partial<Record<string, ChemicalGroup>> = { reducer: 'reducer', acid: 'acid' };

export type IncompatiblePair = {
  code: string;
  a: ChemicalGroup;
  b: ChemicalGroup;
  hazard: string;
  source: string;
};

const MEMORY = 'recalled from memory; check the safety data sheet';

export const INCOMPATIBLE_PAIRS: readonly IncompatiblePair[] = [
  {
    code: 'reducer-acid',
    a: 'reducer',
    b: 'acid',
    hazard:
      'An acid decomposes the reducer and gives off sulfur dioxide, a choking, toxic gas; sodium dithionite also heats itself when damp and can catch fire.',
    source: `sodium dithionite: supplementary hazard EUH031 "Contact with acids liberates toxic gas" in its CLP classification (${MEMORY})`,
  },
  {
    code: 'reducer-oxidiser',
    a: 'reducer',
    b: 'oxidiser',
    hazard: 'A reducer and an oxidiser (such as potassium dichromate) react with heat; dry mixtures can ignite.',
    source: `potassium dichromate: H272 "May intensify fire; oxidiser" in its CLP classification (${MEMORY})`,
  },
  {
    code: 'hypochlorite-acid',
    a: 'hypochlorite',
    b: 'acid',
    hazard: 'Acid on a hypochlorite (bleach) releases chlorine gas.',
    source: `sodium hypochlorite solutions: EUH031 "Contact with acids liberates toxic gas" (${MEMORY})`,
  },
  {
    code: 'arsenic-acid',
    a: 'arsenic',
    b: 'acid',
    hazard:
      'Acid frees arsenious acid from an arsenite, no less poisonous; with a reducing metal (zinc, iron, aluminium) or a reducer present it can give arsine gas, which is deadly in small amounts.',
    source: `arsine from arsenic compounds, acid and a reducing metal is the Marsh test reaction (${MEMORY})`,
  },
  {
    code: 'arsenic-reducer',
    a: 'arsenic',
    b: 'reducer',
    hazard: 'A reducer with an arsenic compound can give arsine gas, which is deadly in small amounts.',
    source: `arsenic compounds are reduced to arsine by strong reducers (${MEMORY})`,
  },
  {
    code: 'quicklime-water',
    a: 'quicklime',
    b: 'water',
    hazard:
      'Quicklime slakes in water with strong heat and can boil and spit caustic lime: add it a little at a time to plenty of cold water, with goggles and gloves.',
    source: `calcium oxide: exothermic reaction with water (slaking) (${MEMORY})`,
  },
  {
    code: 'alkali-aluminium',
    a: 'strong-alkali',
    b: 'aluminium-metal',
    hazard:
      'A strong alkali dissolves aluminium with heat and gives off hydrogen, a flammable gas: never use aluminium pots or foil in a caustic bath or vat.',
    source: `sodium hydroxide: reacts with aluminium and zinc to give hydrogen (${MEMORY})`,
  },
];
