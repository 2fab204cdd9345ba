// The grey-scale grades computed from a trial's stored fastness readings, beside the assessor's own grade:
// change in colour by ISO 105-A05, staining by ISO 105-A04 (shared/compute/grey-scale.ts, its sources there).
import type { Fastness, ReadingPair } from '../schemas/fastness.ts';
import { GREY_SCALE_SOURCES, greyScaleGrades, type GreyScaleResult } from './grey-scale.ts';

export type ComputedFastnessGrade = {
  test: 'washing' | 'rubbingDry' | 'rubbingWet';
  scale: 'change' | 'staining';
  /** The grade the assessor gave by eye, if any. */
  assessor: string | null;
  computed: GreyScaleResult;
  source: string;
};

/** One row per stored before/after pair, in the order the fastness section shows them. */
export function computedFastnessGrades(f: Fastness | null | undefined): ComputedFastnessGrade[] {
  if (!f) return [];
  const rows: ComputedFastnessGrade[] = [];
  const add = (
    test: ComputedFastnessGrade['test'],
    scale: ComputedFastnessGrade['scale'],
    pair: ReadingPair | null | undefined,
    assessor: string | null | undefined,
  ) => {
    if (!pair) return;
    const computed = greyScaleGrades(pair.before, pair.after)[scale];
    rows.push({ test, scale, assessor: assessor ?? null, computed, source: GREY_SCALE_SOURCES[scale] });
  };
  add('washing', 'change', f.washing?.readings?.change, f.washing?.change);
  add('washing', 'staining', f.washing?.readings?.staining, f.washing?.staining);
  add('rubbingDry', 'staining', f.rubbingDry?.readings?.staining, f.rubbingDry?.staining);
  add('rubbingWet', 'staining', f.rubbingWet?.readings?.staining, f.rubbingWet?.staining);
  return rows;
}
