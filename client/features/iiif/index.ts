// The public entry of the iiif feature: what other features may use (lint forbids reaching past it).
export { manifestUrl } from './api';
export { JobStatus } from './components/JobStatus';
export { PhotoTiles } from './components/PhotoTiles';
export { ProgressBar } from './components/ProgressBar';
