import type { Transaction } from 'sequelize';
import { PaletteColour, Region, type Photo } from '../models/index.ts';
import { calibrateImage } from './chart.ts';
import { correctImage, patchWhite } from './correction.ts';
import { workingImage } from './decode.ts';
import { extractPalette, type ExtractedColour, type RawImage, type Rect } from './palette.ts';
import { paletteRows } from './rows.ts';
import { bradfordMatrix, deltaE00 } from '../../shared/colour/index.ts';
import { masterFileOnDisk } from './files.ts';
import type { PaletteVariant } from '../../shared/schemas/chart.ts';

/** Regions that get a palette of their own. */
export const PALETTE_PURPOSES = new Set(['colour-area', 'motif']);
/** Regions left out of every palette: changing one changes every palette it overlaps, and the corrected set. */
export const EXCLUDING_PURPOSES = new Set(['exclusion', 'reference-patch']);

/**
 * What a change touches. 'all': an exclusion or the reference patch changed, so every palette
 * is recomputed (the unaffected ones come out identical, so their rows stay as they are);
 * { regionId }: a colour area or motif was added or changed, so only its own palettes are.
 */
export type RepaletteScope = 'all' | { regionId: number };

/** A stored colour survives a recompute (same row, same id) when the new colour is within this ΔE00 of it. */
const SAME_COLOUR_DE00 = 5;

/** A rectangle in full-size upright pixels, moved into a working image that shows `frame` at `scale`. */
function into(rect: Rect, frame: Rect, scale: number): Rect {
  return { x: (rect.x - frame.x) * scale, y: (rect.y - frame.y) * scale, w: rect.w * scale, h: rect.h * scale };
}

/**
 * Writes one palette (a region and variant) over its stored rows: each new colour takes the row of
 * the nearest stored colour within SAME_COLOUR_DE00 (closest pairs first), so rows that trials
 * point at keep their ids; leftover rows are deleted, leftover colours added. A background flag
 * set by hand stays on its colour, and the shares are worked out again around it.
 */
async function reconcile(
  photoId: number,
  regionId: number | null,
  variant: PaletteVariant,
  colours: ExtractedColour[],
  stored: PaletteColour[],
  transaction: Transaction,
) {
  const pairs: Array<[number, number, number]> = [];
  colours.forEach((c, i) =>
    stored.forEach((s, j) => {
      const d = deltaE00(c.lab, s);
      if (d <= SAME_COLOUR_DE00) pairs.push([d, i, j]);
    }),
  );
  pairs.sort((x, y) => x[0] - y[0] || x[1] - y[1] || x[2] - y[2]);
  const rowOf = new Map<number, PaletteColour>(),
    taken = new Set<number>();
  for (const [, i, j] of pairs)
    if (!rowOf.has(i) && !taken.has(j)) {
      rowOf.set(i, stored[j]);
      taken.add(j);
    }

  const manual = colours.map((_, i) => rowOf.get(i)?.backgroundManual ?? false);
  const background = colours.map((c, i) => (manual[i] ? rowOf.get(i)!.background : c.background));
  const counted = colours.reduce((s, c, i) => s + (background[i] ? 0 : c.areaShare), 0);
  const order = colours
    .map((_, i) => i)
    .sort((x, y) => Number(background[x]) - Number(background[y]) || colours[y].areaShare - colours[x].areaShare);
  const rows = paletteRows(
    photoId,
    regionId,
    variant,
    order.map((i) => ({
      ...colours[i],
      background: background[i],
      share: background[i] || !counted ? colours[i].areaShare : colours[i].areaShare / counted,
    })),
  );
  for (const [rank, i] of order.entries()) {
    const values = { ...rows[rank], backgroundManual: manual[i] };
    const row = rowOf.get(i);
    if (row) {
      row.set(values);
      if (row.changed()) await row.save({ transaction });
    } else {
      await PaletteColour.create(values, { transaction });
    }
  }
  const gone = stored.filter((_, j) => !taken.has(j)).map((s) => s.id);
  if (gone.length) await PaletteColour.destroy({ where: { id: gone }, transaction });
}

/**
 * Recomputes the palettes of a photo that `scope` touches and writes them over the stored rows
 * (see reconcile): the whole photo and each colour-area or motif region, with exclusions and
 * reference patches left out of all of them. With a reference patch, each palette is also computed
 * after a Bradford adaptation of the patch's white to D65 ('corrected'); with a colour chart
 * (photo.chart, fitted by services/photo-chart.ts), through the chart's 3×3 correction ('calibrated'),
 * and the chart's area is left out of every palette. The master file is never altered. Returns every palette row of the photo.
 */
export async function repalette({
  transaction,
  photo,
  scope = 'all',
  decoded,
}: {
  transaction: Transaction;
  photo: Photo;
  scope?: RepaletteScope;
  /** The whole photo's working image when the caller has already decoded it (the chart service), to save a decode. */
  decoded?: RawImage & { scale: number };
}) {
  const master = photo.derivatives.master?.path;
  if (!master) throw new Error(`Photo ${photo.id} has no master file`);
  const file = await masterFileOnDisk(master, photo.sha256);
  const regions = await Region.findAll({ where: { photoId: photo.id }, order: [['id', 'ASC']], transaction });
  const patchRegion = regions.find((r) => r.purpose === 'reference-patch');
  const patch: Rect | null =
    photo.referencePatch ??
    (patchRegion ? { x: patchRegion.x, y: patchRegion.y, w: patchRegion.w, h: patchRegion.h } : null);
  const excluded: Rect[] = regions
    .filter((r) => EXCLUDING_PURPOSES.has(r.purpose))
    .map(({ x, y, w, h }) => ({ x, y, w, h }));
  if (patch) excluded.push(patch);
  // A colour chart is never part of the cloth's palette; its correction gives the 'calibrated' set.
  const chart = photo.chart ?? null;
  if (chart) excluded.push(chart.excluded);
  const stored = await PaletteColour.findAll({ where: { photoId: photo.id }, transaction });
  const storedOf = (regionId: number | null, variant: PaletteVariant) =>
    stored.filter((c) => (c.regionId ?? null) === regionId && c.variant === variant);

  const full: Rect = { x: 0, y: 0, w: photo.width, h: photo.height };
  // The patch's white is read from the whole photo, so a region's corrected palette matches the photo's.
  const whole = scope === 'all' || patch ? (decoded ?? (await workingImage(file))) : null;
  const white = patch && whole ? patchWhite(whole, into(patch, full, whole.scale)) : null;

  const compute = async (img: RawImage, frame: Rect, scale: number, regionId: number | null) => {
    const options = { exclude: excluded.map((r) => into(r, frame, scale)), detectBackground: regionId === null };
    await reconcile(photo.id, regionId, 'raw', extractPalette(img, options), storedOf(regionId, 'raw'), transaction);
    const corrected = white ? extractPalette(correctImage(img, white).image, options) : [];
    await reconcile(photo.id, regionId, 'corrected', corrected, storedOf(regionId, 'corrected'), transaction);
    const calibrated = chart ? extractPalette(calibrateImage(img, chart.matrix), options) : [];
    await reconcile(photo.id, regionId, 'calibrated', calibrated, storedOf(regionId, 'calibrated'), transaction);
  };
  if (scope === 'all') await compute(whole!, full, whole!.scale, null);
  for (const r of regions.filter(
    (x) => PALETTE_PURPOSES.has(x.purpose) && (scope === 'all' || x.id === scope.regionId),
  )) {
    const frame = { x: r.x, y: r.y, w: r.w, h: r.h };
    const img = await workingImage(file, frame);
    await compute(img, frame, img.scale, r.id);
  }
  // A region that no longer has a palette of its own (removed, or now another purpose) loses its rows.
  const ownRegions = new Set(regions.filter((x) => PALETTE_PURPOSES.has(x.purpose)).map((x) => x.id));
  const orphans = stored
    .filter(
      (c) => c.regionId != null && !ownRegions.has(c.regionId) && (scope === 'all' || c.regionId === scope.regionId),
    )
    .map((c) => c.id);
  if (orphans.length) await PaletteColour.destroy({ where: { id: orphans }, transaction });

  if (scope === 'all') {
    await photo.update(
      {
        correction: white
          ? { method: 'bradford', to: 'D65', patch, patchWhiteXyz: white, matrix: bradfordMatrix(white) }
          : null,
      },
      { transaction },
    );
  }
  return PaletteColour.findAll({ where: { photoId: photo.id }, transaction });
}
