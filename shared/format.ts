// One way to write dates and numbers across the app: ISO 8601 dates (2025-03-14 10:22, the same in every
// browser and on paper) in the reader's own time zone, and numbers that never show "−0.0".

const pad = (n: number) => String(n).padStart(2, '0');

/** 2025-03-14, in the reader's time zone. */
export function formatDate(value: string | Date): string {
  const d = typeof value === 'string' ? new Date(value) : value;
  if (Number.isNaN(d.getTime())) return String(value);
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}`;
}

/** 2025-03-14 10:22, in the reader's time zone. */
export function formatDateTime(value: string | Date): string {
  const d = typeof value === 'string' ? new Date(value) : value;
  if (Number.isNaN(d.getTime())) return String(value);
  return `${formatDate(d)} ${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

/** A camera's local time as written ("2025-03-14T10:22:05", no zone) → 2025-03-14 10:22, never shifted. */
export function formatLocalDateTime(value: string): string {
  const m = /^(\d{4}-\d{2}-\d{2})[T ](\d{2}:\d{2})/.exec(value);
  return m ? `${m[1]} ${m[2]}` : value;
}

/** Fixed decimals with a true minus sign, and no sign on a value that rounds to zero (no "−0.0"). */
export function formatNumber(x: number, decimals = 1): string {
  const s = x.toFixed(decimals);
  if (/^-0(\.0*)?$/.test(s)) return s.slice(1);
  return s.startsWith('-') ? `−${s.slice(1)}` : s;
}

/** A file size as people say it: 23 kB, 4.2 MB (decimal units, as file managers show them). */
export function formatBytes(bytes: number): string {
  if (bytes < 1000) return `${bytes} bytes`;
  if (bytes < 1_000_000) return `${Math.round(bytes / 1000)} kB`;
  return `${(bytes / 1_000_000).toFixed(1)} MB`;
}

/** EXIF exposure time in seconds → 1/60 s, 1/4000 s, 0.5 s, 2 s. */
export function formatExposure(seconds: number): string {
  if (seconds <= 0) return `${seconds} s`;
  if (seconds < 0.5) return `1/${Math.round(1 / seconds)} s`;
  return `${Number(seconds.toFixed(1))} s`;
}

export type ExifFacts = {
  make?: string;
  model?: string;
  lens?: string;
  exposureTime?: number;
  fNumber?: number;
  iso?: number;
  focalLengthMm?: number;
  dateTimeOriginal?: string;
};

/** The EXIF a curator reads, as labelled values with units. */
export function exifLines(exif: ExifFacts): Array<{ label: string; value: string }> {
  const lines: Array<{ label: string; value: string }> = [];
  const camera = [
    exif.make,
    exif.model && exif.make && exif.model.startsWith(exif.make)
      ? exif.model.slice(exif.make.length).trim()
      : exif.model,
  ]
    .filter(Boolean)
    .join(' ');
  if (camera) lines.push({ label: 'Camera', value: camera });
  if (exif.lens) lines.push({ label: 'Lens', value: exif.lens });
  if (exif.exposureTime != null) lines.push({ label: 'Exposure', value: formatExposure(exif.exposureTime) });
  if (exif.fNumber != null) lines.push({ label: 'Aperture', value: `f/${Number(exif.fNumber.toFixed(1))}` });
  if (exif.iso != null) lines.push({ label: 'Sensitivity', value: `ISO ${exif.iso}` });
  if (exif.focalLengthMm != null)
    lines.push({ label: 'Focal length', value: `${Number(exif.focalLengthMm.toFixed(1))} mm` });
  if (exif.dateTimeOriginal) {
    const m = /^(\d{4}):(\d{2}):(\d{2})[ T](\d{2}):(\d{2})/.exec(exif.dateTimeOriginal);
    lines.push({
      label: 'Taken',
      value: m ? `${m[1]}-${m[2]}-${m[3]} ${m[4]}:${m[5]} (camera's clock)` : exif.dateTimeOriginal,
    });
  }
  return lines;
}
