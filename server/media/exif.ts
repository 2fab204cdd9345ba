import exifr from 'exifr';

export type ExifSummary = {
  make?: string;
  model?: string;
  lens?: string;
  exposureTime?: number;
  fNumber?: number;
  iso?: number;
  focalLengthMm?: number;
  dateTimeOriginal?: string;
  orientation?: number;
  iccDescription?: string;
};

export type Gps = { latitude: number; longitude: number; altitude?: number };

const str = (v: unknown) => (typeof v === 'string' && v.trim() ? v.trim() : undefined);
const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : undefined);

/**
 * EXIF of interest to a curator, and GPS apart (it is kept on the photo row only, for
 * curators and admins). A path is read from the file in chunks (exifr's
 * chunked reader), not whole. reviveValues:false keeps dates as the camera wrote them
 * ("2024:05:06 07:08:09", no time zone) instead of guessing one from the server's.
 */
export async function readExif(
  input: Buffer | string,
): Promise<{ exif: ExifSummary; gps: Gps | null; capturedAt: string | null }> {
  let tags: Record<string, unknown> | undefined;
  try {
    tags = await exifr.parse(input, {
      tiff: true,
      exif: true,
      gps: true,
      icc: true,
      reviveValues: false,
      translateValues: false,
      mergeOutput: true,
    });
  } catch {
    tags = undefined; // no or unreadable metadata is not a reason to refuse the photo
  }
  if (!tags) return { exif: {}, gps: null, capturedAt: null };
  const raw = str(tags.DateTimeOriginal) ?? str(tags.CreateDate) ?? str(tags.ModifyDate);
  const exif: ExifSummary = Object.fromEntries(
    Object.entries({
      make: str(tags.Make),
      model: str(tags.Model),
      lens: str(tags.LensModel) ?? str(tags.Lens),
      exposureTime: num(tags.ExposureTime),
      fNumber: num(tags.FNumber),
      iso: num(tags.ISO),
      focalLengthMm: num(tags.FocalLength),
      dateTimeOriginal: raw,
      orientation: num(tags.Orientation),
      iccDescription: str(tags.ProfileDescription) ?? str(tags.description),
    }).filter(([, v]) => v !== undefined),
  );
  const lat = num(tags.latitude),
    lon = num(tags.longitude);
  const alt = num(tags.GPSAltitude);
  const gps =
    lat !== undefined && lon !== undefined
      ? { latitude: lat, longitude: lon, ...(alt !== undefined ? { altitude: alt } : {}) }
      : null;
  // "2024:05:06 07:08:09" → "2024-05-06T07:08:09" (local time of the camera, no zone).
  const m = raw?.match(/^(\d{4}):(\d{2}):(\d{2})[ T](\d{2}):(\d{2}):(\d{2})/);
  return { exif, gps, capturedAt: m ? `${m[1]}-${m[2]}-${m[3]}T${m[4]}:${m[5]}:${m[6]}` : null };
}
