// Accession numbers as institutions write them: 1931.4.12, 1931.4.12a-b, T.14-1950, 1957-94-1,
// L2020.3, EX 2021/1, 2008.245a,b. Letters and digits, with spaces and . - / , between them.

export const ACCESSION_MAX = 40;
// Parts of letters and digits joined by one separator (a mark, a mark and a space, or a space): no doubled marks.
export const ACCESSION_PATTERN = /^[\p{L}\p{N}]+(?:(?:[.,/-] ?| )[\p{L}\p{N}]+)*$/u;
export const ACCESSION_MESSAGE =
  'Use letters and digits, with spaces or . - / , between them, e.g. 1931.4.12, T.14-1950 or EX 2021/1';

/** As typed, with runs of spaces made one (a number is compared without them anyway). */
export const tidyAccession = (s: string) => s.normalize('NFC').trim().replace(/\s+/g, ' ');

/** The key that must be unique: case and spaces do not make a different number ("ex 2021/1" = "EX 2021/1"). */
export const accessionKey = (s: string) => s.normalize('NFKC').replace(/\s+/g, '').toLowerCase();

/**
 * A string whose plain (code-unit) order is the natural order: each run of digits is written as its length
 * (two digits) then the digits without leading zeros, so 1931.4.2 sorts before 1931.4.12 and 1931.4.12
 * before 1931.4.12a-b. The archive list (a column with a binary collation) and the search ranking both use it.
 */
export function accessionSortKey(s: string): string {
  return accessionKey(s).replace(/\d+/g, (run) => {
    const digits = run.replace(/^0+(?=\d)/, '');
    return String(Math.min(digits.length, 99)).padStart(2, '0') + digits;
  });
}

/** Natural order of two accession numbers, the same as the archive list's. */
export const compareAccession = (a: string, b: string) => {
  const x = accessionSortKey(a);
  const y = accessionSortKey(b);
  return x < y ? -1 : x > y ? 1 : 0;
};
