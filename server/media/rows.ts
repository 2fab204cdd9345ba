import type { PaletteVariant } from '../../shared/schemas/chart.ts';
import type { ExtractedColour } from './palette.ts';

/** Palette rows as stored: ranked in the order given (by share, background last). */
export function paletteRows(
  photoId: number,
  regionId: number | null,
  variant: PaletteVariant,
  colours: ExtractedColour[],
) {
  return colours.map((c, rank) => ({
    photoId,
    regionId,
    variant,
    rank,
    L: c.lab.L,
    a: c.lab.a,
    b: c.lab.b,
    hex: c.hex,
    share: c.share,
    spread: c.spread,
    name: c.name,
    tradeName: c.tradeName,
    background: c.background,
    source: 'image-estimate',
  }));
}
