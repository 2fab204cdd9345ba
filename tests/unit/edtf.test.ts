import { describe, expect, it } from 'vitest';
import { dateIssues, edtfYears, parseEdtf } from '../../shared/edtf.ts';
import { ACCESSION_PATTERN, pieceCreateSchema } from '../../shared/schemas/piece.ts';
import examples from '../reference/edtf-examples.json' with { type: 'json' };

// Examples of the Library of Congress EDTF specification (2019; ISO 8601-2:2019 levels 0, 1 and parts of 2), recalled
// from memory and corroborated where tests/reference/edtf-examples.json says so; the years are Tinctoria's reading.
type Valid = {
  edtf: string;
  valid: true;
  earliest: number | null;
  latest: number | null;
  startQualified: boolean;
  endQualified: boolean;
};
type Invalid = { edtf: string; valid: false; message_contains: string };
const valid = (examples as Array<Valid | Invalid>).filter((e): e is Valid => e.valid);
const invalid = (examples as Array<Valid | Invalid>).filter((e): e is Invalid => !e.valid);

describe("EDTF: the specification's examples", () => {
  it.each(valid.map((e) => [e.edtf, e] as const))('reads %s', (text, e) => {
    const r = parseEdtf(text);
    expect(r.ok ? r.value : r.message).toMatchObject({
      earliest: e.earliest,
      latest: e.latest,
      startQualified: e.startQualified,
      endQualified: e.endQualified,
    });
  });
  it.each(invalid.map((e) => [e.edtf, e.message_contains] as const))('refuses %j, saying so', (text, message) => {
    const r = parseEdtf(text);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toContain(message);
  });
});

describe('EDTF year bounds', () => {
  it.each([
    ['1770/..', 1770, null],
    ['1852-02-29', 1852, 1852],
    ['2000-02-29', 2000, 2000],
    ['185X-02-29', 1850, 1859],
    [' 1760~ ', 1760, 1760],
  ])('%s → %s–%s', (v, earliest, latest) => {
    expect(edtfYears(v)).toEqual({ earliest, latest });
  });

  it.each(['1785/1770', '1770-13', 'about 1770', '17', '1770/1780/1790', '', '1850-02-3X', '1850-4X', 'Y17E400'])(
    'refuses %j',
    (v) => {
      expect(edtfYears(v)).toBeNull();
    },
  );
});

describe('piece date rules', () => {
  const paths = (p: Parameters<typeof dateIssues>[0]) => dateIssues(p).map((i) => i.path);
  it('lets an approximate or uncertain date carry a wider range, never a narrower one', () => {
    expect(dateIssues({ dateEdtf: '1760~', earliestYear: 1755, latestYear: 1765 })).toEqual([]);
    expect(dateIssues({ dateEdtf: '1785?/1795', earliestYear: 1780, latestYear: 1795 })).toEqual([]);
    expect(paths({ dateEdtf: '1785?/1795', earliestYear: 1780, latestYear: 1800 })).toEqual(['latestYear']);
    expect(paths({ dateEdtf: '1760~', earliestYear: 1761, latestYear: 1765 })).toEqual(['earliestYear']);
    expect(paths({ dateEdtf: '1760~', earliestYear: 1755, latestYear: 1759 })).toEqual(['latestYear']);
  });
  it('holds an exact date to its own years', () => {
    expect(dateIssues({ dateEdtf: '1770/1785', earliestYear: 1770, latestYear: 1785 })).toEqual([]);
    expect(paths({ dateEdtf: '1760', earliestYear: 1755, latestYear: 1765 })).toEqual(['earliestYear', 'latestYear']);
    expect(paths({ dateEdtf: '17XX', earliestYear: 1700, latestYear: 1750 })).toEqual(['latestYear']);
    // A qualifier on the day alone does not make the year uncertain.
    expect(paths({ dateEdtf: '1760-06-~11', earliestYear: 1755 })).toEqual(['earliestYear']);
  });
  it('leaves an open or unknown end to the cataloguer, in order', () => {
    expect(dateIssues({ dateEdtf: '../1800', earliestYear: 1700, latestYear: 1800 })).toEqual([]);
    expect(paths({ dateEdtf: '1800/', earliestYear: 1800, latestYear: 1790 })).toEqual(['latestYear']);
  });
  it('refuses invalid calendar dates beside the EDTF field', () => {
    expect(dateIssues({ dateEdtf: '1850-02-30' })).toEqual([
      { path: 'dateEdtf', message: 'February 1850 has 28 days; there is no day 30' },
    ]);
    expect(dateIssues({ dateEdtf: '1851-02-29' })[0].message).toBe(
      '1851 is not a leap year: February 1851 has 28 days',
    );
    expect(dateIssues({ dateEdtf: '1850-13' })[0].message).toMatch(/^There is no month 13/);
  });
  it('refuses dates outside the years the archive searches', () => {
    expect(paths({ dateEdtf: 'Y170000002' })).toEqual(['dateEdtf']);
  });
  it('runs in the piece schema', () => {
    const base = { accessionNumber: '1931.4.12', objectName: 'panel', title: 't' };
    expect(
      pieceCreateSchema.safeParse({ ...base, dateEdtf: '1760~', earliestYear: 1755, latestYear: 1765 }).success,
    ).toBe(true);
    const r = pieceCreateSchema.safeParse({ ...base, dateEdtf: '1850-02-30' });
    expect(r.success ? [] : r.error.issues.map((i) => i.path.join('.'))).toEqual(['dateEdtf']);
  });
});

describe('accession numbers', () => {
  it.each([
    '1931.4.12',
    '1931.4.12a-b',
    '1931.4.12.a',
    'T.12',
    '2001.15',
    'T.14-1950',
    '1957-94-1',
    'L2020.3',
    'EX 2021/1',
    '2008.245a,b',
    '2008.245a, b',
    '1931/4/12',
  ])('accepts %s', (v) => expect(ACCESSION_PATTERN.test(v)).toBe(true));
  it.each(['1931..4', ' 1931.4', '1931.4.', '#12', '1931.4.12;a', '12 - 3', ''])('refuses %j', (v) =>
    expect(ACCESSION_PATTERN.test(v)).toBe(false),
  );
});

describe('piece schema', () => {
  it('accepts millimetres with one decimal and refuses two', () => {
    const base = { accessionNumber: '1931.4.12', objectName: 'panel', title: 't' };
    expect(pieceCreateSchema.safeParse({ ...base, heightMm: 412.3 }).success).toBe(true);
    expect(pieceCreateSchema.safeParse({ ...base, heightMm: 412.35 }).success).toBe(false);
  });
});
