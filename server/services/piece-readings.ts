import { measurementSchema, type MeasurementInput } from '../../shared/schemas/trial.ts';
import { ColourMeasurement, Trial, type Piece } from '../models/index.ts';
import { audit } from './audit.ts';
import type { ServiceCtx } from './context.ts';
import { readingRow } from './trials/measurements.ts';

// Instrument readings of the original itself (a piece, not a trial): typed L*a*b* or a reflectance
// spectrum, offered as trial targets and, when both sides are spectra, the source of the metamerism table.

const summary = (m: ColourMeasurement) => ({
  id: m.id,
  label: m.label,
  L: m.L,
  a: m.a,
  b: m.b,
  illuminant: m.illuminant,
  observer: m.observer,
  spectral: m.spectrum != null,
});

export async function addPieceReading({ actor, transaction, input }: ServiceCtx<MeasurementInput & { piece: Piece }>) {
  const { piece, ...rest } = input;
  const m = await ColourMeasurement.create(
    { ...readingRow(actor, measurementSchema.parse(rest)), pieceId: piece.id },
    { transaction },
  );
  await audit({ actor, transaction }, 'piece', piece.id, 'reading-added', { reading: { from: null, to: summary(m) } });
  return m;
}

/** A removed reading is no longer any trial's target (the column has no foreign key): those trials lose it here. */
export async function removePieceReading({
  actor,
  transaction,
  input,
}: ServiceCtx<{ piece: Piece; measurement: ColourMeasurement }>) {
  const { piece, measurement: m } = input;
  await Trial.update(
    { targetMeasurementId: null, targetAim: null },
    { where: { targetMeasurementId: m.id }, transaction },
  );
  await m.destroy({ transaction });
  await audit({ actor, transaction }, 'piece', piece.id, 'reading-removed', {
    reading: { from: summary(m), to: null },
  });
}
