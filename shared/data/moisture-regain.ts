// Commercial moisture regain by fibre: the water an "air-dry" (conditioned, commercial) fibre carries,
// as a percentage of its oven-dry mass. Commercial mass = oven-dry mass × (1 + regain / 100).
//
// Source: ASTM D1909, "Standard Table of Commercial Moisture Regains and Commercial Allowances for
// Textile Fibers". The values below are RECALLED FROM MEMORY, not read in a stored copy of the table:
// check them against the current edition before relying on them. Check values with the same marking:
// tests/reference/moisture-regain.json.

export const MOISTURE_REGAIN_SOURCE =
  'ASTM D1909, Standard Table of Commercial Moisture Regains and Commercial Allowances for Textile Fibers (values recalled from memory)';

export type FibreClass = 'cellulose' | 'protein';

export type FibreEntry = {
  key: string;
  label: string;
  class: FibreClass;
  /** Words that name the fibre in the free-text fibre field ("organic cotton calico" → cotton). */
  words: string[];
  /** Commercial moisture regain, % of oven-dry mass; null where no value is recorded here. */
  regainPct: number | null;
  /** How sure the recollection is, and anything a reader should know about the figure. */
  note?: string;
};

export const FIBRES: readonly FibreEntry[] = [
  { key: 'cotton', label: 'cotton', class: 'cellulose', words: ['cotton', 'calico', 'muslin'], regainPct: 8.5 },
  { key: 'linen', label: 'linen (flax)', class: 'cellulose', words: ['linen', 'flax'], regainPct: 12 },
  { key: 'hemp', label: 'hemp', class: 'cellulose', words: ['hemp'], regainPct: 12 },
  { key: 'jute', label: 'jute', class: 'cellulose', words: ['jute'], regainPct: 13.75 },
  {
    key: 'ramie',
    label: 'ramie',
    class: 'cellulose',
    words: ['ramie'],
    regainPct: 8.5,
    note: 'low confidence: other tables give ramie a higher regain; check the standard',
  },
  {
    key: 'viscose',
    label: 'viscose (rayon)',
    class: 'cellulose',
    words: ['viscose', 'rayon'],
    regainPct: 11,
    note: 'regenerated cellulose',
  },
  { key: 'silk', label: 'silk', class: 'protein', words: ['silk'], regainPct: 11 },
  {
    key: 'wool',
    label: 'wool',
    class: 'protein',
    words: ['wool', 'merino', 'lambswool', 'worsted'],
    regainPct: 13.6,
    note: 'commercial allowance for scoured wool; tops and yarns carry other allowances',
  },
  // Protein and bast fibres the mordant checks recognise; no regain recorded here.
  {
    key: 'alpaca',
    label: 'alpaca',
    class: 'protein',
    words: ['alpaca', 'mohair', 'cashmere', 'angora', 'camel', 'llama', 'yak'],
    regainPct: null,
  },
  { key: 'nettle', label: 'nettle', class: 'cellulose', words: ['nettle', 'sisal', 'kapok'], regainPct: null },
];
