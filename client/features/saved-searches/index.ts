// The public entry of the saved-searches feature: what other features may use (lint forbids reaching past it).
export { SavedSearchLinks } from './components/SavedSearchLinks';
export { SavedSearchPanel } from './components/SavedSearchPanel';
export type { SavedSearch } from './api';
