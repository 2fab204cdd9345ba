// The public entry of the records feature (analyses, condition reports, light exposure).
export { AnalysesPanel } from './components/AnalysesPanel';
export { ConditionPanel } from './components/ConditionPanel';
export { LightPanel } from './components/LightPanel';
export { useAnalyses } from './api';
export type { Analysis } from './api';
