// The public entry of the batches feature: what other features may use (lint forbids reaching past it).
export { useBatches } from './api';
