// The public entry of the reference feature: what other features may use (lint forbids reaching past it).
export { useChemicals, useDyestuffs } from './api';
export { ChemicalCaution } from './components/ChemicalCaution';
