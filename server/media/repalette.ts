import { readFile } from 'node:fs/promises';
import type { Transaction } from 'sequelize';
import { PaletteColour, Region, type Photo } from '../models/index.ts';
import { correctImage, patchWhite } from './correction.ts';
import { workingImage } from './decode.ts';
import { extractPalette, type RawImage, type Rect } from './palette.ts';
import { paletteRows } from './rows.ts';
import { bradfordMatrix } from '../../shared/colour/index.ts';
import { resolveInsideUploads } from './paths.ts';

type RowInput = ReturnType<typeof paletteRows>[number];

/** A rectangle in full-size upright pixels, moved into a working image that shows `frame` at `scale`. */
function into(rect: Rect, frame: Rect, scale: number): Rect {
  return { x: (rect.x - frame.x) * scale, y: (rect.y - frame.y) * scale, w: rect.w * scale, h: rect.h * scale };
}

/**
 * Recomputes every palette of a photo and replaces its palette rows: the whole photo and
 * each colour-area or motif region; exclusion and reference-patch regions are left out.
 * With a reference patch, each palette is also computed after a Bradford adaptation of the
 * patch's white to D65 ('corrected'); the master file is never altered.
 */
export async function repalette({ transaction, photo }: { transaction: Transaction; photo: Photo }) {
  const master = photo.derivatives.master?.path;
  if (!master) throw new Error(`Photo ${photo.id} has no master file`);
  const buffer = await readFile(resolveInsideUploads(master));
  const regions = await Region.findAll({ where: { photoId: photo.id }, order: [['id', 'ASC']], transaction });
  const patchRegion = regions.find((r) => r.purpose === 'reference-patch');
  const patch: Rect | null = photo.referencePatch ?? (patchRegion ? { x: patchRegion.x, y: patchRegion.y, w: patchRegion.w, h: patchRegion.h } : null);
  const excluded: Rect[] = regions.filter((r) => r.purpose === 'exclusion' || r.purpose === 'reference-patch').map(({ x, y, w, h }) => ({ x, y, w, h }));
  if (patch) excluded.push(patch);

  const whole = await workingImage(buffer);
  const full: Rect = { x: 0, y: 0, w: photo.width, h: photo.height };
  const white = patch ? patchWhite(whole, into(patch, full, whole.scale)) : null;

  const rows: RowInput[] = [];
  const add = (img: RawImage, frame: Rect, scale: number, regionId: number | null) => {
    const options = { exclude: excluded.map((r) => into(r, frame, scale)), detectBackground: regionId === null };
    rows.push(...paletteRows(photo.id, regionId, 'raw', extractPalette(img, options)));
    if (white) rows.push(...paletteRows(photo.id, regionId, 'corrected', extractPalette(correctImage(img, white).image, options)));
  };
  add(whole, full, whole.scale, null);
  for (const r of regions.filter((x) => x.purpose === 'colour-area' || x.purpose === 'motif')) {
    const frame = { x: r.x, y: r.y, w: r.w, h: r.h };
    const img = await workingImage(buffer, frame);
    add(img, frame, img.scale, r.id);
  }

  await PaletteColour.destroy({ where: { photoId: photo.id }, transaction });
  const created = await PaletteColour.bulkCreate(rows, { transaction });
  await photo.update(
    { correction: white ? { method: 'bradford', to: 'D65', patch, patchWhiteXyz: white, matrix: bradfordMatrix(white) } : null },
    { transaction },
  );
  return created;
}
