/**
 * Extended Date/Time Format (EDTF) — the one reader used by the piece form, the API, CSV import and the exports.
 *
 * Source: Library of Congress, "Extended Date/Time Format (EDTF) Specification" (2019), which ISO 8601-2:2019 adopted.
 * Read here:
 *  - Level 0: 1985, 1985-04, 1985-04-12, date-times 1985-04-12T23:20:30 (Z or ±hh:mm), intervals 1964/2008.
 *  - Level 1: qualifiers ? (uncertain) ~ (approximate) % (both) after the date; unspecified digits 201X, 20XX,
 *    2004-XX, 1985-04-XX; years beyond four digits with Y (Y170000002, Y-170000002); seasons 21–24;
 *    intervals with an open (..) or unknown (empty) end: 1985-04-12/.., ../1985-04-12, 1985-04-12/, /1985-04-12.
 *  - Level 2 (parts): a qualifier on one component (2004?-06-11, 2004-06-~11, ?2004-06-~11); X in any digit
 *    (156X-12-25, 1XXX, XXXX-12-XX); exponent and significant digits (Y17E7, 1950S2); sub-year groupings 25–41;
 *    sets [1667,1668,1670..1672] (one of) and lists {1667,1668} (all of).
 * Calendar dates are checked in the proleptic Gregorian calendar (ISO 8601): 1850-02-30 and 1851-02-29 are refused.
 *
 * We wrote this rather than use the npm `edtf` package (4.11.1, BSD-2-Clause): that one rolls 1851-02-29 over to
 * 1851-03-01 without a word and its refusals are parser syntax errors, not messages a cataloguer can act on.
 */

export type YearRange = { earliest: number | null; latest: number | null };

/** What a value says about its years; a qualified end (? ~ % on its year) may carry a wider stored range. */
export type EdtfValue = {
  kind: 'date' | 'interval' | 'set' | 'list';
  /** Literal earliest and latest year; null where an interval or set end is open (..) or unknown (empty). */
  earliest: number | null;
  latest: number | null;
  startQualified: boolean;
  endQualified: boolean;
};
export type EdtfResult = { ok: true; value: EdtfValue } | { ok: false; message: string };

export const EDTF_HINT = 'e.g. 1850-06-14, 1760~ (about), 1785? (perhaps), 17XX, 1770/1785, ../1800';
const NOT_EDTF = `Not an EDTF date; write it as ${EDTF_HINT}`;

const MONTHS = [
  'January',
  'February',
  'March',
  'April',
  'May',
  'June',
  'July',
  'August',
  'September',
  'October',
  'November',
  'December',
];
const isLeap = (y: number) => (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
const daysIn = (y: number, m: number) => (m === 2 ? (isLeap(y) ? 29 : 28) : [4, 6, 9, 11].includes(m) ? 30 : 31);

class Refusal extends Error {}
const refuse = (message: string): never => {
  throw new Refusal(message);
};

/** One date: its earliest and latest moment as ordinal keys (year·10⁴ + month·10² + day), its years, and qualifiers. */
type Point = { lo: number; hi: number; earliest: number; latest: number; yearQualified: boolean };

const key = (y: number, m: number, d: number) => y * 10_000 + m * 100 + d;

/** Digits that may hold X (unspecified): the smallest and largest number they allow. */
const digitsRange = (digits: string) =>
  [Number(digits.replaceAll('X', '0')), Number(digits.replaceAll('X', '9'))] as const;

// A component is: optional leading qualifier, digits (X allowed), optional trailing qualifier.
const COMPONENT = /^([?~%]?)([\dX]+)([?~%]?)$/;

function readYear(text: string): { lo: number; hi: number; pre: string; post: string } {
  // Y-prefixed years (level 1: more than four digits; level 2: exponent E and significant digits S).
  const y = /^([?~%]?)Y(-?)(\d+)(?:E(\d+))?(?:S(\d+))?([?~%]?)$/.exec(text);
  if (y) {
    const [, pre, sign, digits, exp, sig, post] = y;
    if (!exp && digits.length < 5)
      refuse(
        `A year written with Y has more than four digits (Y${sign}${digits} is ${sign}${digits.padStart(4, '0')})`,
      );
    const value = Number(digits) * 10 ** Number(exp ?? 0) * (sign ? -1 : 1);
    if (!Number.isSafeInteger(value)) refuse(`Y${sign}${digits}${exp ? `E${exp}` : ''} is too large a year to read`);
    return { ...significant(value, sig), pre, post };
  }
  const m = /^([?~%]?)(-?)([\dX]{4})(?:S(\d+))?([?~%]?)$/.exec(text);
  if (!m)
    return refuse(
      /^-?\d{1,3}$/.test(text)
        ? `Write the year with four digits (e.g. ${text.startsWith('-') ? '-' : ''}${text.replace('-', '').padStart(4, '0')})`
        : NOT_EDTF,
    );
  const [, pre, sign, digits, sig, post] = m;
  if (sign && digits === '0000') refuse('There is no year -0000; write 0000');
  if (sig && digits.includes('X')) refuse(NOT_EDTF);
  const [a, b] = digitsRange(digits);
  if (sig) return { ...significant(Number(digits) * (sign ? -1 : 1), sig), pre, post };
  return sign ? { lo: -b, hi: -a, pre, post } : { lo: a, hi: b, pre, post };
}

/** "1950S2": the value is known to two significant digits, so any year 1900–1999. */
function significant(value: number, sig: string | undefined) {
  if (!sig) return { lo: value, hi: value };
  const digits = String(Math.abs(value)).length;
  const s = Number(sig);
  if (s < 1 || s > digits) refuse(`S${sig} asks for more significant digits than the year has`);
  const unit = 10 ** (digits - s);
  const base = Math.trunc(value / unit) * unit;
  return value < 0 ? { lo: base - unit + 1, hi: base } : { lo: base, hi: base + unit - 1 };
}

function readDate(text: string): Point {
  if (text.includes('T')) return readDateTime(text);
  const parts = text.split(/(?<=[\dX?~%])-/);
  if (parts.length > 3) refuse(NOT_EDTF);
  const year = readYear(parts[0]);
  let yearQualified = year.pre !== '' || year.post !== '';
  let [mLo, mHi, dLo, dHi] = [1, 12, 1, 31];
  let season = false;
  if (parts.length >= 2) {
    const mm = COMPONENT.exec(parts[1]);
    if (!mm || mm[2].length !== 2) return refuse(NOT_EDTF);
    const [, , digits, post] = mm;
    // A qualifier right of a component reaches every component to its left, the year included (level 2); one left
    // of a component (2004-~06) is that component's only. "2004-06~" (level 1) thus qualifies the whole date.
    if (post) yearQualified = true;
    if (digits.includes('X')) {
      [mLo, mHi] = digitsRange(digits);
      mLo = Math.max(mLo, 1);
      mHi = Math.min(mHi, 12);
      if (mLo > mHi) refuse(`There is no month ${digits}; use 01–12`);
    } else {
      const n = Number(digits);
      if (n >= 21 && n <= 41) season = true;
      else if (n < 1 || n > 12)
        refuse(`There is no month ${digits}; use 01–12, or 21–24 for spring, summer, autumn, winter`);
      else mLo = mHi = n;
    }
  }
  if (parts.length === 3) {
    if (season) refuse('A season (21–41) takes no day');
    const dd = COMPONENT.exec(parts[2]);
    if (!dd || dd[2].length !== 2) return refuse(NOT_EDTF);
    const [, , digits, post] = dd;
    if (post) yearQualified = true;
    // The most days any month and year this date allows can have (February: 29 only if a leap year is allowed).
    const exactYear = year.lo === year.hi;
    const maxDay = mLo !== mHi ? 31 : mLo === 2 ? (anyLeap(year.lo, year.hi) ? 29 : 28) : daysIn(2000, mLo);
    [dLo, dHi] = digitsRange(digits);
    dLo = Math.max(dLo, 1);
    dHi = Math.min(dHi, maxDay);
    if (!digits.includes('X')) {
      const d = Number(digits);
      if (d < 1) refuse(`There is no day ${digits}`);
      if (d > maxDay) {
        if (mLo !== mHi) refuse(`No month has a day ${digits}`);
        if (mLo === 2 && d === 29)
          refuse(
            exactYear
              ? `${year.lo} is not a leap year: February ${year.lo} has 28 days`
              : 'None of these years is a leap year: February has 28 days',
          );
        refuse(
          `${MONTHS[mLo - 1]}${mLo === 2 && exactYear ? ` ${year.lo}` : ''} has ${maxDay} days; there is no day ${digits}`,
        );
      }
    } else if (dLo > dHi) refuse(`There is no day ${digits}${mLo === mHi ? ` in ${MONTHS[mLo - 1]}` : ''}`);
  }
  if (season) [mLo, mHi, dLo, dHi] = [1, 12, 1, 31];
  return { lo: key(year.lo, mLo, dLo), hi: key(year.hi, mHi, dHi), earliest: year.lo, latest: year.hi, yearQualified };
}

const anyLeap = (lo: number, hi: number) => {
  for (let y = lo; y <= Math.min(hi, lo + 8); y++) if (isLeap(y)) return true;
  return false;
};

/** Level 0 date and time: 1985-04-12T23:20:30, with Z or ±hh(:mm). No qualifiers or X. */
function readDateTime(text: string): Point {
  const m = /^(-?\d{4}-\d{2}-\d{2})T(\d{2}):(\d{2}):(\d{2})(Z|[+-]\d{2}(?::?\d{2})?)?$/.exec(text);
  if (!m) return refuse(`Write a date and time as 1985-04-12T23:20:30 (Z or +01:00 for the time zone, optional)`);
  const [, date, hh, mi, ss, zone] = m;
  const h = Number(hh);
  const point = readDate(date);
  if (h > 24 || Number(mi) > 59 || Number(ss) > 59 || (h === 24 && (mi !== '00' || ss !== '00')))
    refuse(`There is no time ${hh}:${mi}:${ss}`);
  if (zone && zone !== 'Z') {
    const [zh, zm] = [Number(zone.slice(1, 3)), Number(zone.slice(-2))];
    if (zh > 14 || (zone.length > 3 && zm > 59)) refuse(`There is no time zone ${zone}`);
  }
  return point;
}

/** An interval end: a date, open (..) or unknown (empty). */
function readEnd(text: string): Point | 'open' | 'unknown' {
  if (text === '..') return 'open';
  if (text === '') return 'unknown';
  if (text.includes('T')) refuse('An interval runs from date to date, without times of day');
  return readDate(text);
}

function readInterval(text: string): EdtfValue {
  const [a, b, ...rest] = text.split('/');
  if (rest.length) refuse('An interval has one slash: start/end');
  const start = readEnd(a);
  const end = readEnd(b);
  if (typeof start === 'string' && typeof end === 'string')
    refuse('Give at least one end of the interval, e.g. 1770/.. or ../1800');
  if (typeof start !== 'string' && typeof end !== 'string' && start.lo > end.hi)
    refuse(`The interval ends (${b}) before it starts (${a})`);
  return {
    kind: 'interval',
    earliest: typeof start === 'string' ? null : start.earliest,
    latest: typeof end === 'string' ? null : end.latest,
    startQualified: typeof start !== 'string' && start.yearQualified,
    endQualified: typeof end !== 'string' && end.yearQualified,
  };
}

/** Level 2 sets [a,b,c..d] (one of them) and lists {a,b} (all of them); ".." at either end leaves it open. */
function readSet(text: string): EdtfValue {
  const kind = text.startsWith('[') ? 'set' : 'list';
  const body = text.slice(1, -1).trim();
  if (!body) refuse('Name at least one date between the brackets');
  let earliest: number | null = Infinity;
  let latest: number | null = -Infinity;
  let [startQualified, endQualified] = [false, false];
  const items = body.split(',').map((s) => s.trim());
  items.forEach((item, i) => {
    const range = /^(.*?)\.\.(.*)$/.exec(item);
    const ends = range ? [range[1], range[2]] : [item, item];
    if (range && ends[0] === '' && i !== 0) refuse('Only the first member of a set may be open at its start (..1760)');
    if (range && ends[1] === '' && i !== items.length - 1)
      refuse('Only the last member of a set may be open at its end (1760..)');
    const lo = ends[0] === '' ? null : readDate(ends[0]);
    const hi = ends[1] === '' ? null : readDate(ends[1]);
    if (!lo && !hi) refuse(NOT_EDTF);
    if (lo && hi && lo.lo > hi.hi) refuse(`${item} ends before it starts`);
    if (!lo) earliest = null;
    else if (earliest !== null && lo.earliest < earliest) {
      earliest = lo.earliest;
      startQualified = lo.yearQualified;
    }
    if (!hi) latest = null;
    else if (latest !== null && hi.latest > latest) {
      latest = hi.latest;
      endQualified = hi.yearQualified;
    }
  });
  return { kind, earliest, latest, startQualified, endQualified };
}

/** Read an EDTF value, or say in words what is wrong with it. */
export function parseEdtf(input: string): EdtfResult {
  const text = input.trim();
  if (!text) return { ok: false, message: 'Enter an EDTF date' };
  if (/\s/.test(text) && !/^[[{]/.test(text)) return { ok: false, message: NOT_EDTF };
  try {
    if (/^\[.*\]$|^\{.*\}$/.test(text)) return { ok: true, value: readSet(text) };
    if (text.includes('/')) return { ok: true, value: readInterval(text) };
    if (text === '..') return { ok: false, message: 'Give at least one end of the interval, e.g. 1770/.. or ../1800' };
    const p = readDate(text);
    return {
      ok: true,
      value: {
        kind: 'date',
        earliest: p.earliest,
        latest: p.latest,
        startQualified: p.yearQualified,
        endQualified: p.yearQualified,
      },
    };
  } catch (err) {
    if (err instanceof Refusal) return { ok: false, message: err.message };
    throw err;
  }
}

/** The earliest and latest year an EDTF value names (null for an open or unknown end), or null when it is not EDTF. */
export function edtfYears(value: string): YearRange | null {
  const r = parseEdtf(value);
  return r.ok ? { earliest: r.value.earliest, latest: r.value.latest } : null;
}

/** The years a piece can store for searching (the database and the forms agree on these). */
export const YEAR_MIN = -5000;
export const YEAR_MAX = 2200;

export type DateFields = { dateEdtf?: string | null; earliestYear?: number | null; latestYear?: number | null };
export type DateIssue = { path: keyof DateFields; message: string };

/**
 * Date rules for a piece, shared by the form, the API and CSV import.
 * An exact end must agree with its stored year. An uncertain or approximate end (? ~ % on its year) may store a wider
 * range, never a narrower one: "1760~" may be searched as 1755–1765 (how wide is the cataloguer's judgement).
 */
export function dateIssues(p: DateFields): DateIssue[] {
  const issues: DateIssue[] = [];
  const { earliestYear: from, latestYear: to } = p;
  if (from != null && to != null && from > to)
    issues.push({ path: 'latestYear', message: 'Latest year must not be before the earliest year' });
  if (!p.dateEdtf) return issues;
  const r = parseEdtf(p.dateEdtf);
  if (!r.ok) return [...issues, { path: 'dateEdtf', message: r.message }];
  const v = r.value;
  for (const y of [v.earliest, v.latest])
    if (y != null && (y < YEAR_MIN || y > YEAR_MAX))
      return [
        ...issues,
        { path: 'dateEdtf', message: `The archive searches years ${YEAR_MIN} to ${YEAR_MAX}; this date reaches ${y}` },
      ];
  if (from != null && v.earliest != null) {
    if (!v.startQualified && from !== v.earliest)
      issues.push({
        path: 'earliestYear',
        message: `The EDTF date starts in ${v.earliest}; only an uncertain (?) or approximate (~) date may start earlier`,
      });
    else if (v.startQualified && from > v.earliest)
      issues.push({
        path: 'earliestYear',
        message: `The EDTF date may start in ${v.earliest}; the earliest year cannot be later`,
      });
  }
  if (to != null && v.latest != null) {
    if (!v.endQualified && to !== v.latest)
      issues.push({
        path: 'latestYear',
        message: `The EDTF date ends in ${v.latest}; only an uncertain (?) or approximate (~) date may end later`,
      });
    else if (v.endQualified && to < v.latest)
      issues.push({
        path: 'latestYear',
        message: `The EDTF date may end in ${v.latest}; the latest year cannot be earlier`,
      });
  }
  return issues;
}
