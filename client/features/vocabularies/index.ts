// The public entry of the vocabularies feature: what other features may use (lint forbids reaching past it).
export { useVocabularies } from './api';
