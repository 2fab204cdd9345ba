import { describe, expect, it } from 'vitest';
import { up } from '../../server/db/migrations/0013-palette-names.ts';
import { PaletteColour, Photo, sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { hexToLab } from '../../shared/colour/index.ts';

// Stored palette names are derived again from each row's L*a*b* when the naming rules change.
describe('migration 0013: palette names derived again', () => {
  it('renames rows named under the old rules and leaves the rest alone', async () => {
    const piece = await makePiece();
    const photo = await Photo.create({
      pieceId: piece.id,
      trialId: null,
      sha256: `names${Date.now()}`.padEnd(64, '0'),
      format: 'jpeg',
      bytes: 1,
      width: 1,
      height: 1,
      originalName: null,
      caption: null,
      capturedAt: null,
      exif: {},
      gps: null,
      derivatives: {},
      referencePatch: null,
      correction: null,
      createdById: null,
    });
    const row = (hex: string, rank: number, name: string, tradeName: string | null) =>
      PaletteColour.create({
        photoId: photo.id,
        regionId: null,
        variant: 'raw',
        rank,
        ...hexToLab(hex),
        hex,
        share: 0.25,
        spread: 1,
        name,
        tradeName,
        background: false,
      });
    // The names these colours were given before: madder brown as "dark red", navy as "dark purple", olive as "yellow".
    const brown = await row('#6a3b35', 0, 'dark greyish red', null);
    const navy = await row('#000080', 1, 'dark vivid purple', null);
    const olive = await row('#808000', 2, 'vivid yellow', null);
    const red = await row('#b0302a', 3, 'vivid red', 'Turkey red');
    const before = red.updatedAt;
    await up({
      context: { queryInterface: sequelize.getQueryInterface(), sequelize },
      name: '0013-palette-names',
      path: undefined,
    });
    for (const r of [brown, navy, olive, red]) await r.reload();
    expect([brown.name, brown.tradeName]).toEqual(['brown', 'madder brown']);
    expect(navy.name).toBe('dark vivid blue');
    expect(olive.name).toBe('olive');
    expect([red.name, red.tradeName, red.updatedAt]).toEqual(['vivid red', 'Turkey red', before]);
  });
});
