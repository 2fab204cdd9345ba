import type { Transaction } from 'sequelize';
import { IMAGE_ESTIMATE_CONDITIONS, conditionsText } from '../../shared/colour/conditions.ts';
import { fadingReport } from '../../shared/compute/fading.ts';
import { VARIANT_TRUST } from '../../shared/schemas/chart.ts';
import type { FadingPairCreateInput, FadingPairOut } from '../../shared/schemas/fading.ts';
import { badRequest } from '../http/errors.ts';
import { ColourMeasurement, FadingPair, PaletteColour, Photo, Region, type Piece } from '../models/index.ts';
import { audit } from './audit.ts';
import type { ServiceCtx } from './context.ts';

type Side = FadingPairCreateInput['faded'];

/** A side must belong to the piece: a region of one of its photos, or one of its readings. */
async function checkSide(piece: Piece, side: Side, field: 'faded' | 'protected', transaction: Transaction) {
  if ('regionId' in side) {
    const region = await Region.findByPk(side.regionId, { transaction });
    const photo = region && (await Photo.findByPk(region.photoId, { transaction }));
    if (!photo || photo.pieceId !== piece.id)
      throw badRequest('That region is not on a photo of this piece.', {
        fields: { [`${field}.regionId`]: ['Choose a region of one of this piece’s photos'] },
      });
  } else {
    const m = await ColourMeasurement.findByPk(side.measurementId, { transaction });
    if (!m || m.pieceId !== piece.id)
      throw badRequest('That reading is not of this piece.', {
        fields: { [`${field}.measurementId`]: ['Choose one of this piece’s readings'] },
      });
  }
}

const columns = (side: Side, prefix: 'faded' | 'protected') =>
  'regionId' in side
    ? { [`${prefix}RegionId`]: side.regionId, [`${prefix}MeasurementId`]: null }
    : { [`${prefix}RegionId`]: null, [`${prefix}MeasurementId`]: side.measurementId };

export async function addFadingPair({
  actor,
  transaction,
  input,
}: ServiceCtx<{ piece: Piece; pair: FadingPairCreateInput }>) {
  const { piece, pair } = input;
  await checkSide(piece, pair.faded, 'faded', transaction);
  await checkSide(piece, pair.protected, 'protected', transaction);
  const row = await FadingPair.create(
    {
      pieceId: piece.id,
      label: pair.label ?? null,
      ...(columns(pair.faded, 'faded') as { fadedRegionId: number | null; fadedMeasurementId: number | null }),
      ...(columns(pair.protected, 'protected') as {
        protectedRegionId: number | null;
        protectedMeasurementId: number | null;
      }),
      createdById: actor?.id ?? null,
    },
    { transaction },
  );
  await audit({ actor, transaction }, 'piece', piece.id, 'fading-pair-added', {
    fadingPair: { from: null, to: { id: row.id, label: row.label, faded: pair.faded, protected: pair.protected } },
  });
  return row;
}

export async function removeFadingPair({ actor, transaction, input }: ServiceCtx<{ piece: Piece; pair: FadingPair }>) {
  const { piece, pair } = input;
  await pair.destroy({ transaction });
  await audit({ actor, transaction }, 'piece', piece.id, 'fading-pair-removed', {
    fadingPair: { from: { id: pair.id, label: pair.label }, to: null },
  });
}

const PURPOSE_WORDS: Record<string, string> = {
  'colour-area': 'colour area',
  motif: 'motif',
  'sampling-site': 'sampling site',
  exclusion: 'exclusion',
  'reference-patch': 'reference patch',
};

async function resolveSide(regionId: number | null, measurementId: number | null): Promise<FadingPairOut['faded']> {
  if (regionId != null) {
    const region = await Region.findByPk(regionId);
    const rows = await PaletteColour.findAll({
      where: { regionId, background: false },
      order: [['rank', 'ASC']],
    });
    const best = VARIANT_TRUST.map((v) => rows.find((r) => r.variant === v)).find(Boolean) ?? null;
    return {
      kind: 'region',
      id: regionId,
      label: `${region?.label ?? PURPOSE_WORDS[region?.purpose ?? ''] ?? 'region'} (photo ${region?.photoId ?? '?'})`,
      lab: best ? { L: best.L, a: best.a, b: best.b } : null,
      variant: best?.variant ?? null,
      ...IMAGE_ESTIMATE_CONDITIONS,
    };
  }
  const m = await ColourMeasurement.findByPk(measurementId!);
  return {
    kind: 'reading',
    id: measurementId!,
    label: m?.label ?? `reading ${measurementId}`,
    lab: m ? { L: m.L, a: m.a, b: m.b } : null,
    variant: null,
    illuminant: m?.illuminant ?? 'D65',
    observer: m?.observer ?? '2',
  };
}

/** A pair with both colours and, when they can be compared, ΔE00, the components and the A05 grade (hook). */
export async function presentFadingPair(p: FadingPair): Promise<FadingPairOut> {
  const faded = await resolveSide(p.fadedRegionId, p.fadedMeasurementId);
  const prot = await resolveSide(p.protectedRegionId, p.protectedMeasurementId);
  let note: string | null = null;
  let difference: FadingPairOut['difference'] = null;
  if (!faded.lab || !prot.lab) note = 'A side has no colour yet (a region without a palette).';
  else if (faded.illuminant !== prot.illuminant || faded.observer !== prot.observer)
    note = `The two sides are under different conditions (${conditionsText(prot)} and ${conditionsText(faded)}), so no difference is given.`;
  else {
    difference = fadingReport(prot.lab, faded.lab);
    if (!difference.a05) note = 'ISO 105-A05 grade not yet computed (its function is not in this version).';
    else if (prot.observer !== '10') note = 'ISO 105-A05 asks for D65/10° readings; this grade is from D65/2° values.';
  }
  return { id: p.id, pieceId: p.pieceId, label: p.label, faded, protected: prot, difference, note };
}

/** What a new pair's sides may be: regions of the piece's photos (not exclusions or patches) and its readings. */
export async function fadingCandidates(pieceId: number) {
  const photos = await Photo.findAll({ where: { pieceId }, attributes: ['id'] });
  const regions = photos.length
    ? await Region.findAll({ where: { photoId: photos.map((p) => p.id) }, order: [['id', 'ASC']] })
    : [];
  const readings = await ColourMeasurement.findAll({ where: { pieceId }, order: [['id', 'ASC']] });
  return {
    regions: regions
      .filter((r) => r.purpose !== 'exclusion' && r.purpose !== 'reference-patch')
      .map((r) => ({ id: r.id, label: `${r.label ?? PURPOSE_WORDS[r.purpose]} (photo ${r.photoId})` })),
    readings: readings.map((m) => ({
      id: m.id,
      label: `${m.label ?? `reading ${m.id}`} (${conditionsText(m)})`,
    })),
  };
}
