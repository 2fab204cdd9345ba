/**
 * Year bounds of an Extended Date/Time Format value (ISO 8601-2 / EDTF level 0–1
 * subset used in cataloguing): a date (1850, 1850-06, 1850-06-14), qualifiers ? ~ %,
 * unspecified digits (17XX, 185X), and intervals with open ends (1770/1785, ../1800).
 * Returns null when the text is not EDTF; an open end gives null for that bound.
 */
export function edtfYears(value: string): { earliest: number | null; latest: number | null } | null {
  const v = value.trim();
  if (!v) return null;
  if (v.includes('/')) {
    const [a, b, ...rest] = v.split('/');
    if (rest.length) return null;
    const start = a === '..' || a === '' ? { earliest: null, latest: null } : point(a);
    const end = b === '..' || b === '' ? { earliest: null, latest: null } : point(b);
    if (!start || !end) return null;
    if (start.earliest != null && end.latest != null && start.earliest > end.latest) return null;
    return { earliest: start.earliest, latest: end.latest };
  }
  return point(v);
}

const POINT = /^(-?)(\d{2}[\dX]{2})(?:-(\d{2}|XX)(?:-(\d{2}|XX))?)?[?~%]?$/;

function point(text: string): { earliest: number; latest: number } | null {
  const m = POINT.exec(text);
  if (!m) return null;
  const [, sign, digits, month, day] = m;
  if (month && month !== 'XX' && !validMonth(Number(month))) return null;
  if (day && day !== 'XX' && (Number(day) < 1 || Number(day) > 31)) return null;
  const s = sign ? -1 : 1;
  const lo = Number(digits.replaceAll('X', '0')) * s;
  const hi = Number(digits.replaceAll('X', '9')) * s;
  return { earliest: Math.min(lo, hi), latest: Math.max(lo, hi) };
}

// EDTF level 1 seasons (21–24) count as months for the year bound.
const validMonth = (m: number) => (m >= 1 && m <= 12) || (m >= 21 && m <= 24);
