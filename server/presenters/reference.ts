import { describeChemical } from '../../shared/compute/chemistry.ts';
import { labelStatements } from '../../shared/compute/hazard-label.ts';
import { ATOMIC_WEIGHTS_SOURCE } from '../../shared/data/atomic-weights.ts';
import type { ChemicalView, DyestuffView } from '../../shared/schemas/reference.ts';
import type { Chemical, Dyestuff } from '../models/index.ts';

/** Molar mass and metal fraction are computed from the formula on the way out, never stored twice. */
export function presentChemical(c: Chemical): ChemicalView {
  const { molarMass, metalMassFraction } = describeChemical(c.formula, c.metal);
  return {
    id: c.id,
    name: c.name,
    role: c.role,
    formula: c.formula,
    molarMass,
    metal: c.metal,
    metalMassFraction,
    status: c.status,
    ghs: {
      signalWord: c.signalWord,
      hStatements: c.hStatements ?? [],
      ppe: c.ppe,
      caution: c.caution,
      source: c.hazardSource,
      basis: c.hazardBasis ?? null,
      labelStatements: labelStatements(c.hStatements ?? []),
    },
    source: c.source,
    atomicWeightsSource: c.formula ? ATOMIC_WEIGHTS_SOURCE : null,
  };
}

export const presentDyestuff = (d: Dyestuff): DyestuffView => ({
  id: d.id,
  name: d.name,
  ciName: d.ciName,
  colorants: d.colorants,
  species: d.species,
  dyeClass: d.dyeClass,
  source: d.source,
});
