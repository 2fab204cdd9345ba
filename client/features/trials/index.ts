// The public entry of the trials feature: what other features may use (lint forbids reaching past it).
export { TargetSelect, targetIds, targetValue } from './components/TrialFields';
export { trialKeys } from './api';
export { PieceReadings } from './components/PieceReadings';
