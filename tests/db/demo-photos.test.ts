import { describe, expect, it } from 'vitest';
import { existsSync } from 'node:fs';
import { photoFile } from '../../server/media/pipeline.ts';
import { PaletteColour, Photo, Piece } from '../../server/models/index.ts';
import { deltaE00, hexToLab } from '../../shared/colour/index.ts';

// The demo seed paints its photos and sends them through the real pipeline (server/seed/demo-photos.ts).
describe('demo photos', () => {
  it('every demo piece has a photo with files and a palette', async () => {
    for (const accessionNumber of ['1931.4.12', '1958.22.4', '1996.9.6', '1962.3.1', '2019.1.1']) {
      const piece = await Piece.findOne({ where: { accessionNumber }, rejectOnEmpty: true });
      const photos = await Photo.findAll({ where: { pieceId: piece.id } });
      expect(photos.length, accessionNumber).toBeGreaterThan(0);
      for (const photo of photos) {
        for (const kind of ['thumb', 'display', 'master'] as const)
          expect(existsSync(photoFile(photo, kind))).toBe(true);
        expect(
          await PaletteColour.count({ where: { photoId: photo.id, variant: 'raw', regionId: null } }),
        ).toBeGreaterThan(0);
      }
    }
  });

  it('the tinted recto of 1931.4.12 has a corrected palette that finds the painted madder red', async () => {
    const piece = await Piece.findOne({ where: { accessionNumber: '1931.4.12' }, rejectOnEmpty: true });
    const photo = await Photo.findOne({ where: { pieceId: piece.id, view: 'recto' }, rejectOnEmpty: true });
    const corrected = await PaletteColour.findAll({
      where: { photoId: photo.id, variant: 'corrected', regionId: null },
    });
    const red = hexToLab('#a23b30');
    const best = Math.min(...corrected.map((c) => deltaE00(c, red)));
    expect(best).toBeLessThanOrEqual(2);
    expect(corrected.some((c) => c.background)).toBe(true);
    expect(corrected.filter((c) => !c.background).reduce((s, c) => s + c.share, 0)).toBeCloseTo(1, 6);
  });
});
