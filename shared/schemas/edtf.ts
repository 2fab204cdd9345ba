// A practical subset of EDTF (ISO 8601-2, Level 0–1): years, year-month(-day), seasons (21–24),
// qualifiers ? ~ %, unspecified digits (17XX, 177X) and intervals a/b with open ends (..).
export type YearRange = { earliest: number | null; latest: number | null };

const DATE = /^(-?\d{4}|\d{2}XX|\d{3}X)(?:-(\d{2}|XX)(?:-(\d{2}|XX))?)?$/;

function parseDate(part: string): YearRange | null {
  const s = part.replace(/[?~%]/g, '');
  const m = DATE.exec(s);
  if (!m) return null;
  const [, year, month, day] = m;
  if (month && month !== 'XX') {
    const mm = Number(month);
    if (!((mm >= 1 && mm <= 12) || (mm >= 21 && mm <= 24))) return null;
    if (day && day !== 'XX' && (mm > 12 || Number(day) < 1 || Number(day) > 31)) return null;
  }
  return { earliest: Number(year.replace(/X/g, '0')), latest: Number(year.replace(/X/g, '9')) };
}

/** The earliest and latest year an EDTF string allows, or null when it is not one this subset reads. */
export function edtfYears(value: string): YearRange | null {
  const v = value.trim();
  if (!v) return null;
  if (!v.includes('/')) return parseDate(v);
  const [a, b, ...rest] = v.split('/');
  if (rest.length) return null;
  const open = (x: string) => x === '..' || x === '';
  const start = open(a) ? { earliest: null, latest: null } : parseDate(a);
  const end = open(b) ? { earliest: null, latest: null } : parseDate(b);
  if (!start || !end || (open(a) && open(b))) return null;
  const range = { earliest: start.earliest, latest: end.latest };
  if (range.earliest !== null && range.latest !== null && range.earliest > range.latest) return null;
  return range;
}
