import { describe, expect, it } from 'vitest';
import { accessionKey, accessionSortKey, compareAccession } from '../../shared/accession.ts';
import { pieceCreateSchema } from '../../shared/schemas/piece.ts';
import { PIECE_CSV_FIELDS, pieceImportRow } from '../../shared/schemas/piece-import.ts';

describe('accession numbers', () => {
  it('take the same key whatever the case and spacing', () => {
    expect(accessionKey('EX 2021/1')).toBe(accessionKey('ex2021/1'));
    expect(accessionKey('T.14-1950')).toBe(accessionKey('t.14-1950'));
    expect(accessionKey('2008.245a, b')).toBe(accessionKey('2008.245A,B'));
    expect(accessionKey('1931.4.12')).not.toBe(accessionKey('1931.4.1.2'));
  });

  it('sort naturally', () => {
    const sorted = [
      '1931.4.12a-b',
      'L2020.3',
      '1931.4.12',
      'EX 2021/1',
      '1931.4.2',
      '1957-94-1',
      'T.14-1950',
      'T.2-1950',
      '1931.4.012',
      '2008.245a,b',
      '1931.10.1',
    ].sort(compareAccession);
    expect(sorted).toEqual([
      '1931.4.2',
      '1931.4.12',
      '1931.4.012',
      '1931.4.12a-b',
      '1931.10.1',
      '1957-94-1',
      '2008.245a,b',
      'EX 2021/1',
      'L2020.3',
      'T.2-1950',
      'T.14-1950',
    ]);
    // Leading zeros do not change the number (so the two keys are equal and the sort is stable).
    expect(accessionSortKey('1931.4.012')).toBe(accessionSortKey('1931.4.12'));
  });

  it('are tidied before checking, in the form and the CSV import alike', () => {
    expect(
      pieceCreateSchema.parse({ accessionNumber: '  EX   2021/1 ', objectName: 'panel', title: 't' }).accessionNumber,
    ).toBe('EX 2021/1');
    const row = { ...Object.fromEntries(PIECE_CSV_FIELDS.map((f) => [f, ''])), objectName: 'panel', title: 't' };
    expect(pieceImportRow.safeParse({ ...row, accessionNumber: '2008.245a,b' }).success).toBe(true);
    const bad = pieceCreateSchema.safeParse({ accessionNumber: '1931.4.12#', objectName: 'panel', title: 't' });
    expect(bad.error?.issues[0]).toMatchObject({
      path: ['accessionNumber'],
      message: expect.stringContaining('e.g. 1931.4.12'),
    });
  });
});
