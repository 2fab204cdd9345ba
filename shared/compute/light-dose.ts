import { LIGHT_LIMITS, type LightCategory } from '../data/light-sensitivity.ts';

/**
 * Light exposure of a piece from its display periods.
 *
 * Exposure (lux·hours) = illuminance (lux) × hours lit a day × days on display, both end days counted
 * (the definition of exposure as illuminance × time; CIE 157:2004 states its limits in lux·hours a year).
 * A piece is in one place at a time, so where entered periods overlap each day counts once, at the highest
 * daily exposure among them (a conservative reading: common practice, our own rule). Years are calendar years,
 * with their true length (366 days in a leap year); a period across a new year is split at 1 January.
 * The total allowance is the annual limit times the calendar years from the first display to now (our own
 * reading of the annual limit, not a figure from the standard).
 */
export type DisplayPeriodInput = { from: string; to: string; lux: number; hoursPerDay: number };

const DAY_MS = 86_400_000;
/** Days since 1970-01-01 of an ISO date (YYYY-MM-DD), in UTC so no clock change shifts a day. */
export function dayNumber(iso: string): number {
  const [y, m, d] = iso.slice(0, 10).split('-').map(Number);
  return Math.round(Date.UTC(y, m - 1, d) / DAY_MS);
}
const yearOfDay = (day: number) => new Date(day * DAY_MS).getUTCFullYear();
const firstDayOfYear = (year: number) => Math.round(Date.UTC(year, 0, 1) / DAY_MS);

/** Days on display, both ends counted: 1 March to 31 March is 31 days. */
export const periodDays = (p: { from: string; to: string }) => dayNumber(p.to) - dayNumber(p.from) + 1;
/** lux × hours a day × days. */
export const periodLuxHours = (p: DisplayPeriodInput) => p.lux * p.hoursPerDay * periodDays(p);

/** Exposure per calendar year, overlapping days counted once at the highest daily exposure. */
export function exposureByYear(periods: DisplayPeriodInput[]): Map<number, { luxHours: number; days: number }> {
  const bounds = new Set<number>();
  for (const p of periods) {
    bounds.add(dayNumber(p.from));
    bounds.add(dayNumber(p.to) + 1);
  }
  const edges = [...bounds].sort((a, b) => a - b);
  const byYear = new Map<number, { luxHours: number; days: number }>();
  for (let i = 0; i < edges.length - 1; i++) {
    const start = edges[i];
    const end = edges[i + 1]; // exclusive
    let rate = -1;
    for (const p of periods)
      if (dayNumber(p.from) <= start && dayNumber(p.to) + 1 >= end) rate = Math.max(rate, p.lux * p.hoursPerDay);
    if (rate < 0) continue; // a gap between displays
    // Split the segment at each 1 January.
    let s = start;
    while (s < end) {
      const year = yearOfDay(s);
      const e = Math.min(end, firstDayOfYear(year + 1));
      const row = byYear.get(year) ?? { luxHours: 0, days: 0 };
      row.luxHours += rate * (e - s);
      row.days += e - s;
      byYear.set(year, row);
      s = e;
    }
  }
  return byYear;
}

export type LightDose = {
  luxHours: number;
  daysOnDisplay: number;
  category: LightCategory;
  annualLimitLuxHours: number | null;
  byYear: Array<{ year: number; luxHours: number; days: number }>;
  /** This calendar year's exposure and the share of the annual limit it uses (null: no limit). */
  thisYear: { year: number; luxHours: number; usedFraction: number | null };
  /** Annual limit × calendar years from the first display to this year. */
  totalAllowanceLuxHours: number | null;
  totalUsedFraction: number | null;
};

export function lightDose(periods: DisplayPeriodInput[], category: LightCategory, today: string): LightDose {
  const byYear = exposureByYear(periods);
  const years = [...byYear.entries()].sort(([a], [b]) => a - b);
  const luxHours = years.reduce((s, [, r]) => s + r.luxHours, 0);
  const daysOnDisplay = years.reduce((s, [, r]) => s + r.days, 0);
  const limit = LIGHT_LIMITS[category].annualLuxHours;
  const year = Number(today.slice(0, 4));
  const thisYear = byYear.get(year)?.luxHours ?? 0;
  const firstYear = years.length ? years[0][0] : year;
  const lastYear = years.length ? Math.max(year, years[years.length - 1][0]) : year;
  const totalAllowance = limit === null ? null : limit * (lastYear - firstYear + 1);
  return {
    luxHours,
    daysOnDisplay,
    category,
    annualLimitLuxHours: limit,
    byYear: years.map(([y, r]) => ({ year: y, luxHours: r.luxHours, days: r.days })),
    thisYear: { year, luxHours: thisYear, usedFraction: limit === null ? null : thisYear / limit },
    totalAllowanceLuxHours: totalAllowance,
    totalUsedFraction: totalAllowance === null ? null : luxHours / totalAllowance,
  };
}

export type AllowanceExcess = { year: number; luxHours: number; limitLuxHours: number };

/** The calendar years a new period would take over the annual limit (empty: it fits). */
export function exceedsAllowance(
  periods: DisplayPeriodInput[],
  next: DisplayPeriodInput,
  category: LightCategory,
): AllowanceExcess[] {
  const limit = LIGHT_LIMITS[category].annualLuxHours;
  if (limit === null) return [];
  const touched = new Set<number>();
  for (let y = Number(next.from.slice(0, 4)); y <= Number(next.to.slice(0, 4)); y++) touched.add(y);
  const after = exposureByYear([...periods, next]);
  return [...after.entries()]
    .filter(([y, r]) => touched.has(y) && r.luxHours > limit)
    .sort(([a], [b]) => a - b)
    .map(([y, r]) => ({ year: y, luxHours: r.luxHours, limitLuxHours: limit }));
}

/** The most light-sensitive category among a piece's dyestuffs; unknown or none: high (the cautious default). */
export function categoryOfDyestuffs(names: string[], table: Record<string, LightCategory>): LightCategory {
  const order: LightCategory[] = ['high', 'medium', 'low', 'irresponsive'];
  if (!names.length) return 'high';
  let best = 3;
  for (const n of names) {
    const c = table[n] ?? table[n.toLowerCase()] ?? 'high';
    best = Math.min(best, order.indexOf(c));
  }
  return order[best];
}
