/**
 * Abridged standard atomic weights (g/mol), IUPAC 2021:
 * Prohaska, T. et al. (2022). Standard atomic weights of the elements 2021
 * (IUPAC Technical Report). Pure Appl. Chem. 94(5):573–600, doi:10.1515/pac-2019-0603.
 * Values as in tests/reference/atomic-weights.json. Only the elements that occur in
 * the trade's chemicals are listed; a formula with any other element is refused.
 * Lead's abridged value carries ±1.1 since 2021, so lead-salt molar masses are ±~1 g/mol.
 */
export const ATOMIC_WEIGHTS_SOURCE =
  'IUPAC 2021 abridged standard atomic weights (Prohaska et al. 2022, Pure Appl. Chem. 94(5):573–600)';

export const ATOMIC_WEIGHTS: Readonly<Record<string, number>> = {
  H: 1.008,
  C: 12.011,
  N: 14.007,
  O: 15.999,
  Na: 22.99,
  Mg: 24.305,
  Al: 26.982,
  S: 32.06,
  Cl: 35.45,
  K: 39.098,
  Ca: 40.078,
  Cr: 51.996,
  Fe: 55.845,
  Cu: 63.546,
  Zn: 65.38,
  As: 74.922,
  Sn: 118.71,
  Sb: 121.76,
  Pb: 207.2,
};

/** Metals whose load the product reports; "heavy" ones are the toxic historical mordants. */
export const METALS = ['Al', 'Fe', 'Cu', 'Sn', 'Cr', 'Pb', 'As', 'Zn', 'Sb', 'Ca', 'Na', 'K', 'Mg'] as const;
export const HEAVY_METALS = ['Pb', 'Cr', 'Sn', 'Cu', 'As', 'Zn', 'Sb'] as const;
