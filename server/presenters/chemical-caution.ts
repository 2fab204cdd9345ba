import { describeChemical } from '../../shared/compute/chemistry.ts';
import type { Chemical } from '../models/index.ts';

/** A chemical as a recipe shows it: identity, hazard and status, with sources. */
export const presentChemicalBrief = (c: Chemical) => ({
  id: c.id,
  name: c.name,
  role: c.role,
  formula: c.formula,
  metal: c.metal,
  ...describeChemical(c.formula, c.metal),
  status: c.status,
  ghs: { signalWord: c.signalWord, hStatements: c.hStatements ?? [], ppe: c.ppe, caution: c.caution, source: c.hazardSource },
  source: c.source,
});
export type ChemicalBrief = ReturnType<typeof presentChemicalBrief>;

/** A chemical needs a caution when it carries a GHS signal word or is not simply permitted. */
export const isHazardous = (c: Chemical) => c.signalWord != null || (c.hStatements?.length ?? 0) > 0 || c.status !== 'permitted';
