import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import {
  categoryOfDyestuffs,
  dayNumber,
  exceedsAllowance,
  exposureByYear,
  lightDose,
  periodDays,
  periodLuxHours,
} from '../../shared/compute/light-dose.ts';
import { DYESTUFF_CATEGORY, LIGHT_LIMITS } from '../../shared/data/light-sensitivity.ts';

// Exposure = illuminance × time (lux × hours), the quantity CIE 157:2004 sets its annual limits in.
// Every expected value below is worked by hand in the comment beside it.

describe('days and lux·hours of one period', () => {
  it('counts both end days: 1–31 March is 31 days', () =>
    expect(periodDays({ from: '2023-03-01', to: '2023-03-31' })).toBe(31));
  it('a single day is one day', () => expect(periodDays({ from: '2023-03-01', to: '2023-03-01' })).toBe(1));
  // 2024 is a leap year (divisible by 4, not by 100): Feb has 29 days → 1 Feb–1 Mar is 29 + 1 = 30 days.
  it('a leap February has 29 days', () => expect(periodDays({ from: '2024-02-01', to: '2024-03-01' })).toBe(30));
  // 2023: 28 + 1 = 29 days.
  it('a common February has 28 days', () => expect(periodDays({ from: '2023-02-01', to: '2023-03-01' })).toBe(29));
  // 1900 is not a leap year (divisible by 100, not by 400); 2000 is (divisible by 400).
  it('1900 is not leap, 2000 is', () => {
    expect(periodDays({ from: '1900-01-01', to: '1900-12-31' })).toBe(365);
    expect(periodDays({ from: '2000-01-01', to: '2000-12-31' })).toBe(366);
  });
  // 50 lx × 8 h × 31 d = 12 400 lx·h.
  it('lux × hours a day × days', () =>
    expect(periodLuxHours({ from: '2023-03-01', to: '2023-03-31', lux: 50, hoursPerDay: 8 })).toBe(12_400));
  // A whole leap year at 50 lx, 10 h: 366 × 500 = 183 000 lx·h.
  it('a whole leap year', () =>
    expect(periodLuxHours({ from: '2024-01-01', to: '2024-12-31', lux: 50, hoursPerDay: 10 })).toBe(183_000));
  it('is not moved by a clock change (UTC days)', () =>
    expect(dayNumber('2024-03-31') - dayNumber('2024-03-30')).toBe(1));
});

describe('exposure per calendar year', () => {
  it('splits a period at 1 January', () => {
    // 2023-12-25..2024-01-05: 7 days in 2023 (25–31), 5 in 2024 (1–5); at 100 lx × 6 h = 600 lx·h a day.
    const y = exposureByYear([{ from: '2023-12-25', to: '2024-01-05', lux: 100, hoursPerDay: 6 }]);
    expect(y.get(2023)).toEqual({ luxHours: 4_200, days: 7 });
    expect(y.get(2024)).toEqual({ luxHours: 3_000, days: 5 });
  });
  it('counts overlapping days once, at the higher daily exposure', () => {
    // A: 1–10 Jan at 50 lx × 10 h = 500/day; B: 6–15 Jan at 80 lx × 10 h = 800/day.
    // Days 1–5: 5 × 500 = 2 500; days 6–15: 10 × 800 = 8 000; total 10 500 over 15 days.
    const y = exposureByYear([
      { from: '2023-01-01', to: '2023-01-10', lux: 50, hoursPerDay: 10 },
      { from: '2023-01-06', to: '2023-01-15', lux: 80, hoursPerDay: 10 },
    ]);
    expect(y.get(2023)).toEqual({ luxHours: 10_500, days: 15 });
  });
  it('counts a period inside another once (the brighter wins for its days)', () => {
    // Outer 1–30 Jun at 50 lx × 8 h = 400/day; inner 11–20 Jun at 30 lx × 8 h = 240/day (dimmer): 30 × 400 = 12 000.
    const y = exposureByYear([
      { from: '2023-06-01', to: '2023-06-30', lux: 50, hoursPerDay: 8 },
      { from: '2023-06-11', to: '2023-06-20', lux: 30, hoursPerDay: 8 },
    ]);
    expect(y.get(2023)).toEqual({ luxHours: 12_000, days: 30 });
  });
  it('adds separate periods with a gap between them', () => {
    // 1–10 Mar: 10 × 400 = 4 000; 21–30 Mar: 10 × 400 = 4 000; total 8 000 over 20 days.
    const y = exposureByYear([
      { from: '2023-03-01', to: '2023-03-10', lux: 50, hoursPerDay: 8 },
      { from: '2023-03-21', to: '2023-03-30', lux: 50, hoursPerDay: 8 },
    ]);
    expect(y.get(2023)).toEqual({ luxHours: 8_000, days: 20 });
  });
});

describe('allowance', () => {
  it('uses the CIE 157:2004 limits (check values tests/reference/light-limits.json, recalled from memory)', () => {
    const ref = JSON.parse(readFileSync(path.join(__dirname, '../reference/light-limits.json'), 'utf8')) as Array<{
      category: keyof typeof LIGHT_LIMITS;
      limiting_illuminance_lux: number | null;
      limiting_annual_exposure_lux_hours: number | null;
    }>;
    for (const r of ref) {
      expect(LIGHT_LIMITS[r.category].annualLuxHours).toBe(r.limiting_annual_exposure_lux_hours);
      expect(LIGHT_LIMITS[r.category].maxLux).toBe(r.limiting_illuminance_lux);
    }
  });
  it('this year, total and fraction used', () => {
    // Medium: 150 000 lx·h/year. 2023: 1–31 Mar at 50 × 8 = 12 400; 2024: 1–31 Mar (31 d) = 12 400.
    // Total 24 800; allowance over 2023–2024 = 2 × 150 000 = 300 000; used 24 800 / 300 000.
    const d = lightDose(
      [
        { from: '2023-03-01', to: '2023-03-31', lux: 50, hoursPerDay: 8 },
        { from: '2024-03-01', to: '2024-03-31', lux: 50, hoursPerDay: 8 },
      ],
      'medium',
      '2024-06-01',
    );
    expect(d.luxHours).toBe(24_800);
    expect(d.thisYear).toEqual({ year: 2024, luxHours: 12_400, usedFraction: 12_400 / 150_000 });
    expect(d.totalAllowanceLuxHours).toBe(300_000);
    expect(d.totalUsedFraction).toBeCloseTo(24_800 / 300_000, 12);
  });
  it('irresponsive has no limit', () => {
    const d = lightDose(
      [{ from: '2023-03-01', to: '2023-03-31', lux: 500, hoursPerDay: 8 }],
      'irresponsive',
      '2023-06-01',
    );
    expect(d.thisYear.usedFraction).toBeNull();
    expect(d.totalAllowanceLuxHours).toBeNull();
  });
  it('warns for the years a new period takes over the limit', () => {
    // High: 15 000 lx·h/year. Existing 2024: 1–20 Jan at 50 × 8 = 400/day × 20 = 8 000.
    // New 1–20 Feb 2024 (20 days × 400 = 8 000) → 16 000 > 15 000.
    const existing = [{ from: '2024-01-01', to: '2024-01-20', lux: 50, hoursPerDay: 8 }];
    expect(
      exceedsAllowance(existing, { from: '2024-02-01', to: '2024-02-20', lux: 50, hoursPerDay: 8 }, 'high'),
    ).toEqual([{ year: 2024, luxHours: 16_000, limitLuxHours: 15_000 }]);
    // 1–17 Feb: 17 × 400 = 6 800 → 14 800 ≤ 15 000: fits.
    expect(
      exceedsAllowance(existing, { from: '2024-02-01', to: '2024-02-17', lux: 50, hoursPerDay: 8 }, 'high'),
    ).toEqual([]);
    // Re-entering the same days (an overlap) adds nothing.
    expect(exceedsAllowance(existing, existing[0], 'high')).toEqual([]);
  });
});

describe('category from the dyestuffs (common practice, recalled from memory)', () => {
  it('takes the most sensitive dyestuff; none or unknown is high (cautious)', () => {
    expect(categoryOfDyestuffs(['madder'], DYESTUFF_CATEGORY)).toBe('medium');
    expect(categoryOfDyestuffs(['madder', 'weld'], DYESTUFF_CATEGORY)).toBe('high');
    expect(categoryOfDyestuffs([], DYESTUFF_CATEGORY)).toBe('high');
    expect(categoryOfDyestuffs(['unobtainium'], DYESTUFF_CATEGORY)).toBe('high');
  });
});
