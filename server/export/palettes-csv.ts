import type { Writable } from 'node:stream';
import { Op, type WhereOptions } from 'sequelize';
import { csvStringifier } from './csv.ts';
import { IMAGE_ESTIMATE_CONDITIONS } from '../../shared/colour/conditions.ts';
import { PaletteColour, Photo, Piece, Region } from '../models/index.ts';

// Each colour says what it is: an estimate from the photo (CIELAB D65/2°), never an instrument reading.
// `share` is the colour's part of the cloth in its palette; a background row's is its part of the whole area.
const COLUMNS = [
  'pieceAccessionNumber',
  'pieceTitle',
  'photoId',
  'photoName',
  'region',
  'regionId',
  'variant',
  'rank',
  'background',
  'L',
  'a',
  'b',
  'hex',
  'share',
  'name',
  'tradeName',
  'source',
  'illuminant',
  'observer',
] as const;

const PIECES_PER_BATCH = 200;
const n = (x: number, d: number) => x.toFixed(d);

/** Writes the palettes of the given pieces (in accession order) as CSV, a batch of pieces at a time. */
export async function writePalettesCsv(out: Writable, where: WhereOptions<Piece>) {
  const csv = csvStringifier({ header: true, columns: [...COLUMNS] });
  csv.pipe(out);
  const pieces = await Piece.findAll({
    where,
    attributes: ['id', 'accessionNumber', 'title'],
    order: [['accessionNumber', 'ASC']],
    paranoid: false,
  });
  for (let i = 0; i < pieces.length; i += PIECES_PER_BATCH) {
    const batch = pieces.slice(i, i + PIECES_PER_BATCH);
    const photos = await Photo.findAll({
      where: { pieceId: { [Op.in]: batch.map((p) => p.id) } },
      attributes: ['id', 'pieceId', 'originalName'],
      order: [['id', 'ASC']],
    });
    const colours = photos.length
      ? await PaletteColour.findAll({
          where: { photoId: { [Op.in]: photos.map((p) => p.id) } },
          include: [{ model: Region, as: 'region', attributes: ['id', 'label', 'purpose'] }],
          order: [
            ['photoId', 'ASC'],
            ['regionId', 'ASC'],
            ['variant', 'ASC'],
            ['rank', 'ASC'],
          ],
        })
      : [];
    const byPhoto = new Map<number, PaletteColour[]>();
    for (const c of colours) byPhoto.set(c.photoId, [...(byPhoto.get(c.photoId) ?? []), c]);
    for (const piece of batch) {
      for (const photo of photos.filter((p) => p.pieceId === piece.id)) {
        for (const c of byPhoto.get(photo.id) ?? []) {
          const region = (c as PaletteColour & { region?: Region | null }).region;
          csv.write({
            pieceAccessionNumber: piece.accessionNumber,
            pieceTitle: piece.title,
            photoId: photo.id,
            photoName: photo.originalName ?? '',
            region: region ? (region.label ?? `${region.purpose} ${region.id}`) : 'whole photo',
            regionId: region?.id ?? '',
            variant: c.variant,
            rank: c.rank,
            background: c.background ? 'yes' : 'no',
            L: n(c.L, 2),
            a: n(c.a, 2),
            b: n(c.b, 2),
            hex: c.hex,
            share: n(c.share, 4),
            name: c.name,
            tradeName: c.tradeName ?? '',
            source: c.source,
            illuminant: IMAGE_ESTIMATE_CONDITIONS.illuminant,
            observer: `${IMAGE_ESTIMATE_CONDITIONS.observer}°`,
          });
        }
      }
    }
  }
  csv.end();
  await new Promise((resolve, reject) => out.on('finish', resolve).on('error', reject));
}
