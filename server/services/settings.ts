import type { Transaction } from 'sequelize';
import { DEFAULT_BANDS, type Bands } from '../../shared/colour/index.ts';
import { AppSetting } from '../models/index.ts';

export type VerdictBands = Bands;
export const VERDICT_BANDS_KEY = 'colour.verdictBands';
export const DEFAULT_BANDS_SOURCE =
  'common practice (ΔE00 ≤ 1 match, ≤ 2 close, ≤ 4 near, > 4 different); no published source';

/** The verdict bands in force: the admin's, or the common-practice defaults. */
export async function verdictBands(transaction?: Transaction): Promise<{ bands: VerdictBands; source: string }> {
  const row = await AppSetting.findByPk(VERDICT_BANDS_KEY, { transaction });
  return row
    ? { bands: row.value as VerdictBands, source: row.source }
    : { bands: DEFAULT_BANDS, source: DEFAULT_BANDS_SOURCE };
}

export async function setVerdictBands(bands: VerdictBands, source: string, transaction: Transaction) {
  await AppSetting.upsert({ key: VERDICT_BANDS_KEY, value: bands, source }, { transaction });
  return verdictBands(transaction);
}
