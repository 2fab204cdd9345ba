import { describe, expect, it } from 'vitest';
import { edtfYears } from '../../shared/edtf.ts';
import { ACCESSION_PATTERN, pieceCreateSchema } from '../../shared/schemas/piece.ts';

// Examples from the EDTF specification (Library of Congress, 2019; ISO 8601-2:2019 levels 0–1):
// "1985-04-12", "1964/2008", "1984?", "2004-06~", "201X", "19XX", "../1985-04-12", "1985-21" (season).
describe('EDTF year bounds', () => {
  it.each([
    ['1985-04-12', 1985, 1985],
    ['1964/2008', 1964, 2008],
    ['1984?', 1984, 1984],
    ['2004-06~', 2004, 2004],
    ['201X', 2010, 2019],
    ['19XX', 1900, 1999],
    ['../1985-04-12', null, 1985],
    ['1770/..', 1770, null],
    ['1985-21', 1985, 1985],
  ])('%s → %s–%s', (v, earliest, latest) => {
    expect(edtfYears(v)).toEqual({ earliest, latest });
  });

  it.each(['1785/1770', '1770-13', 'about 1770', '17', '1770/1780/1790', ''])('refuses %j', (v) => {
    expect(edtfYears(v)).toBeNull();
  });
});

describe('accession numbers', () => {
  it.each(['1931.4.12', '1931.4.12a-b', '1931.4.12.a', 'T.12', '2001.15', 'T.14-1950', '1957-94-1', 'L2020.3', 'EX 2021/1', '2008.245a,b', '2008.245a, b', '1931/4/12'])(
    'accepts %s',
    (v) => expect(ACCESSION_PATTERN.test(v)).toBe(true),
  );
  it.each(['1931..4', ' 1931.4', '1931.4.', '#12', '1931.4.12;a', '12 - 3', ''])('refuses %j', (v) => expect(ACCESSION_PATTERN.test(v)).toBe(false));
});

describe('piece schema', () => {
  it('accepts millimetres with one decimal and refuses two', () => {
    const base = { accessionNumber: '1931.4.12', objectName: 'panel', title: 't' };
    expect(pieceCreateSchema.safeParse({ ...base, heightMm: 412.3 }).success).toBe(true);
    expect(pieceCreateSchema.safeParse({ ...base, heightMm: 412.35 }).success).toBe(false);
  });
});
