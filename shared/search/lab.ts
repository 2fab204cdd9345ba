/**
 * hex ↔ CIELAB (D65, 2°) for the shade chooser and the shade API. One implementation: these are
 * shared/colour/convert.ts (colorjs.io's sRGB, IEC 61966-2-1, and CIE 15 CIELAB), re-exported here so
 * search code and the client keep their import. Checked against tests/reference/srgb-lab.json.
 */
export { hexToLab, labToHex, type Lab } from '../colour/convert.ts';

export const HEX_RE = /^#?[0-9a-fA-F]{6}$/;
