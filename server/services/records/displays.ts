import type { Transaction } from 'sequelize';
import {
  DYESTUFF_CATEGORY,
  LIGHT_LIMITS,
  LIGHT_LIMITS_SOURCE,
  DYESTUFF_CATEGORY_SOURCE,
} from '../../../shared/data/light-sensitivity.ts';
import {
  categoryOfDyestuffs,
  exceedsAllowance,
  lightDose,
  type DisplayPeriodInput,
} from '../../../shared/compute/light-dose.ts';
import type { DisplayCreateInput, LightDoseOut } from '../../../shared/schemas/records.ts';
import { formatNumber } from '../../../shared/format.ts';
import { unprocessable } from '../../http/errors.ts';
import { DisplayPeriod, Piece } from '../../models/index.ts';
import { audit } from '../audit.ts';
import type { SignedInCtx } from '../context.ts';

export const asInput = (d: DisplayPeriod): DisplayPeriodInput => ({
  from: d.fromDate,
  to: d.toDate,
  lux: d.lux,
  hoursPerDay: d.hoursPerDay,
});

/** 246400 → "246 400" (thin grouping, as on the page). */
const grouped = (n: number) => formatNumber(Math.round(n), 0).replace(/\B(?=(\d{3})+(?!\d))/g, ' ');

export const todayIso = () => new Date().toISOString().slice(0, 10);

export function categoryOf(piece: Piece) {
  const names = piece.dyestuffs.map((d) => d.name);
  return { category: categoryOfDyestuffs(names, DYESTUFF_CATEGORY), from: names };
}

export function doseOf(piece: Piece, periods: DisplayPeriodInput[], today = todayIso()): LightDoseOut {
  const { category, from } = categoryOf(piece);
  return {
    ...lightDose(periods, category, today),
    categoryLabel: LIGHT_LIMITS[category].label,
    categoryFrom: from,
    source: `${LIGHT_LIMITS_SOURCE}; category from the dyestuffs: ${DYESTUFF_CATEGORY_SOURCE}`,
  };
}

export async function periodsOf(pieceId: number, transaction?: Transaction) {
  return DisplayPeriod.findAll({
    where: { pieceId },
    order: [
      ['fromDate', 'DESC'],
      ['id', 'DESC'],
    ],
    transaction,
  });
}

/** The warning a curator reads before a period takes the piece over its annual allowance (null: it fits). */
export function excessMessage(piece: Piece, periods: DisplayPeriodInput[], next: DisplayPeriodInput) {
  const { category } = categoryOf(piece);
  const exceeds = exceedsAllowance(periods, next, category);
  if (!exceeds.length) return { exceeds, message: null };
  const years = exceeds.map((e) => `${e.year}: ${grouped(e.luxHours)} of ${grouped(e.limitLuxHours)} lx·h`).join('; ');
  return {
    exceeds,
    message: `This display would take the piece over its annual light allowance (${LIGHT_LIMITS[category].label}) — ${years}.`,
  };
}

export async function createDisplay({
  actor,
  transaction,
  input,
}: SignedInCtx<{ piece: Piece; values: DisplayCreateInput }>) {
  const { piece, values } = input;
  // Locks the piece's periods so two curators logging at once both see each other's exposure.
  await Piece.findByPk(piece.id, { transaction, lock: transaction.LOCK.UPDATE, paranoid: false });
  const existing = (await periodsOf(piece.id, transaction)).map(asInput);
  const next = { from: values.from, to: values.to, lux: values.lux, hoursPerDay: values.hoursPerDay };
  const { exceeds, message } = excessMessage(piece, existing, next);
  if (exceeds.length && !values.confirm)
    throw unprocessable(`${message} Confirm to record it anyway.`, { exceeds, needsConfirmation: true });
  const display = await DisplayPeriod.create(
    {
      pieceId: piece.id,
      fromDate: values.from,
      toDate: values.to,
      lux: values.lux,
      hoursPerDay: values.hoursPerDay,
      uvMicrowattsPerLumen: values.uvMicrowattsPerLumen ?? null,
      place: values.place ?? null,
      createdById: actor.id,
    },
    { transaction },
  );
  await audit({ actor, transaction }, 'piece', piece.id, 'display-logged', {
    display: {
      from: null,
      to: { id: display.id, from: values.from, to: values.to, lux: values.lux, overAllowance: exceeds.length > 0 },
    },
  });
  return { display, dose: doseOf(piece, [...existing, next]) };
}

/** The piece's light dose from all its display periods (the piece detail answers it as lightDose). */
export async function lightDoseOf(piece: Piece) {
  return doseOf(piece, (await periodsOf(piece.id)).map(asInput));
}
