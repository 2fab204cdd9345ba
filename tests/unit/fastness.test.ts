import { describe, expect, it } from 'vitest';
import scales from '../reference/fastness-scales.json' with { type: 'json' };
import {
  BLUE_WOOL_GRADES,
  GREY_GRADES,
  GREY_SCALE_NOMINAL_DE,
  gradeValue,
  greyGradeFromValue,
  nearestGreyGrade,
} from '../../shared/compute/fastness.ts';
import { fastnessSchema } from '../../shared/schemas/fastness.ts';

const change = scales.filter((s) => s.scale === 'grey scale for change in colour');
const staining = scales.filter((s) => s.scale === 'grey scale for staining');
const blue = scales.filter((s) => s.scale.startsWith('blue wool'));

describe('fastness grades', () => {
  // Source: tests/reference/fastness-scales.json (ISO 105-A02 read in a stored preview of the standard; ISO 105-A03 and ISO 105-B02 recalled from memory).
  it('has the grey-scale steps 5 … 1 with half grades and their numeric values', () => {
    expect([...GREY_GRADES]).toEqual(change.map((s) => s.grade));
    for (const s of change) expect(gradeValue(s.grade as (typeof GREY_GRADES)[number])).toBe(s.grade_numeric);
    for (const s of change) expect(greyGradeFromValue(s.grade_numeric)).toBe(s.grade);
  });

  it('has blue wool references 1–8', () => {
    expect([...BLUE_WOOL_GRADES]).toEqual(blue.map((s) => s.grade));
  });

  it('carries the nominal ΔE*ab of each step for change in colour and for staining', () => {
    for (const s of change) expect(GREY_SCALE_NOMINAL_DE.change[s.grade as '5']).toBe(s.dE_ab_nominal);
    for (const s of staining) expect(GREY_SCALE_NOMINAL_DE.staining[s.grade as '5']).toBe(s.dE_ab_nominal);
    expect(nearestGreyGrade(2.4, 'change')).toBe('3-4');
    expect(nearestGreyGrade(2.4, 'staining')).toBe('4-5');
  });
});

describe('fastness schema', () => {
  it('accepts half grades and informal tests, refuses grades off the scales', () => {
    const ok = fastnessSchema.parse({
      light: { blueWool: '5', informal: true },
      washing: { change: '4-5', staining: '3-4' },
      rubbingDry: { staining: '4' },
    });
    expect(ok.washing?.informal).toBe(false);
    expect(fastnessSchema.safeParse({ light: { blueWool: '9' } }).success).toBe(false);
    expect(fastnessSchema.safeParse({ washing: { change: '3.5' } }).success).toBe(false);
    expect(fastnessSchema.safeParse({ washing: {} }).success).toBe(false);
  });
});
