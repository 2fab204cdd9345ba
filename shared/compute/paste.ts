/**
 * Print paste make-up (BRIEF §4.2). A paste is a mordant solution thickened with a
 * gum so it holds a line under a block or brush. Volumes in millilitres, masses in grams.
 */

import { thickenerRange, type ThickenerRange } from './thickeners.ts';

// The thickener's usual g/L depends on its kind (guar, gum arabic, starch…): shared/compute/thickeners.ts.

/** Volume of stock solution to take: V_stock = c · V / c_stock (c1·V1 = c2·V2). */
export function stockVolumeMl(targetGPerL: number, finalVolumeMl: number, stockGPerL: number): number {
  if (!(stockGPerL > 0)) throw new RangeError('The stock concentration must be positive');
  if (targetGPerL > stockGPerL) throw new RangeError('A paste cannot be stronger than the stock it is made from');
  return (targetGPerL * finalVolumeMl) / stockGPerL;
}

export type PasteMordant = { name: string; gPerL: number; stockGPerL?: number | null };
export type PasteInput = {
  finalVolumeMl: number;
  mordants: PasteMordant[];
  thickener?: { name: string; gPerL: number } | null;
};

export type PasteMakeUp = {
  finalVolumeMl: number;
  mordants: Array<{ name: string; gPerL: number; grams: number; stockMl: number | null }>;
  /** `usualRange` is the range for this kind of thickener (null when the app has none); `outsideUsualRange` false then. */
  thickener: {
    name: string;
    gPerL: number;
    grams: number;
    usualRange: ThickenerRange | null;
    outsideUsualRange: boolean;
  } | null;
  /** Water to add after the stock solutions; solids are weighed in and the paste made up to the final volume. */
  waterMl: number;
};

/** Everything to weigh and measure for one paste, from its g/L targets and final volume. */
export function pasteMakeUp(input: PasteInput): PasteMakeUp {
  const { finalVolumeMl } = input;
  if (!(finalVolumeMl > 0)) throw new RangeError('The paste volume must be positive');
  const litres = finalVolumeMl / 1000;
  const mordants = input.mordants.map((m) => {
    const grams = m.gPerL * litres;
    const stockMl = m.stockGPerL ? stockVolumeMl(m.gPerL, finalVolumeMl, m.stockGPerL) : null;
    return { name: m.name, gPerL: m.gPerL, grams, stockMl };
  });
  const stockTotal = mordants.reduce((s, m) => s + (m.stockMl ?? 0), 0);
  if (stockTotal > finalVolumeMl) throw new RangeError('The stock solutions alone exceed the paste volume');
  const range = input.thickener ? thickenerRange(input.thickener.name) : null;
  const thickener = input.thickener
    ? {
        name: input.thickener.name,
        gPerL: input.thickener.gPerL,
        grams: input.thickener.gPerL * litres,
        usualRange: range,
        outsideUsualRange: range != null && (input.thickener.gPerL < range.min || input.thickener.gPerL > range.max),
      }
    : null;
  return { finalVolumeMl, mordants, thickener, waterMl: finalVolumeMl - stockTotal };
}

export type Dilution = {
  parentMl: number;
  waterMl: number;
  /** Thickener to add so the child keeps the parent's thickness (g). */
  thickenerG: number;
  /** Each parent concentration in the child, in g/L. */
  childGPerL: Record<string, number>;
};

/**
 * A child batch diluted from a parent, e.g. weak alum for pinks from the strong alum
 * paste for reds. `fraction` is the child's strength relative to the parent (0–1].
 */
export function dilute(
  parent: { gPerL: Record<string, number>; thickenerGPerL?: number | null; availableMl?: number | null },
  fraction: number,
  childVolumeMl: number,
): Dilution {
  if (!(fraction > 0 && fraction <= 1)) throw new RangeError('The dilution must be a fraction between 0 and 1');
  if (!(childVolumeMl > 0)) throw new RangeError('The child volume must be positive');
  const parentMl = childVolumeMl * fraction;
  if (parent.availableMl != null && parentMl > parent.availableMl)
    throw new RangeError('Not enough of the parent batch is left for this dilution');
  const waterMl = childVolumeMl - parentMl;
  const thickenerG = ((parent.thickenerGPerL ?? 0) * waterMl) / 1000;
  const childGPerL = Object.fromEntries(Object.entries(parent.gPerL).map(([k, c]) => [k, c * fraction]));
  return { parentMl, waterMl, thickenerG, childGPerL };
}
