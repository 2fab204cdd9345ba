// The public entry of the export feature: what other features may use (lint forbids reaching past it).
export { DownloadLink } from './components/DownloadLink';
export { exportUrls } from './urls';
