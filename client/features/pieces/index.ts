// The public entry of the pieces feature: what other features may use (lint forbids reaching past it).
export { pieceKeys, pieceQuery, usePiece } from './api';
export type { Photo } from './api';
export { TextAreaField } from './components/FormBits';
