import { z } from 'zod';
import '../messages.ts';
import { IMAGE_ESTIMATE_CONDITIONS } from '../colour/conditions.ts';
import { PALETTE_VARIANTS, photoChartSchema } from './chart.ts';
import { id, idParams } from './common.ts';
import { photoIngestSchema } from './ingest.ts';

export const PHOTO_VIEWS = ['recto', 'verso', 'detail', 'raking', 'transmitted', 'uv', 'swatch'] as const;
// W3C Web Annotation motivations narrowed to what a region is for on a textile photo.
export const REGION_PURPOSES = ['colour-area', 'motif', 'exclusion', 'reference-patch', 'sampling-site'] as const;
export type RegionPurpose = (typeof REGION_PURPOSES)[number];
export const PHOTO_KINDS = ['thumb', 'display', 'master'] as const;

/**
 * Default limits of one image file: 2 GiB and 1 gigapixel (the server's MEDIA_MAX_BYTES and MEDIA_MAX_PIXELS may set
 * others; its refusals name the limits in force).
 */
export const DEFAULT_MEDIA_MAX_BYTES = 2 * 1024 * 1024 * 1024;
export const DEFAULT_MEDIA_MAX_PIXELS = 1_000_000_000;

/** A byte count in words: "60 MB", "2 GB" (binary units, as the limits are set). */
export function sizeInWords(bytes: number) {
  const gb = bytes / 1024 ** 3;
  if (gb >= 1) return `${Number(gb.toFixed(1))} GB`;
  return `${Number((bytes / 1024 ** 2).toFixed(1))} MB`;
}

/** A pixel count in words: "100 megapixels", "1 gigapixel". */
export function pixelsInWords(pixels: number) {
  if (pixels >= 1e9) {
    const g = Number((pixels / 1e9).toFixed(2));
    return `${g} gigapixel${g === 1 ? '' : 's'}`;
  }
  const m = Number((pixels / 1e6).toFixed(1));
  return `${m} megapixel${m === 1 ? '' : 's'}`;
}
export const UPLOAD_FIELD = 'photo';

export const photoUpdateSchema = z
  .object({
    caption: z.string().trim().max(255, 'Use at most 255 characters').nullable().optional(),
    view: z.enum(PHOTO_VIEWS, { error: 'Choose a view' }).optional(),
  })
  .strict();
export type PhotoUpdateInput = z.infer<typeof photoUpdateSchema>;

const px = (what: string) =>
  z
    .number({ error: `Enter ${what} in pixels` })
    .int(`Use whole pixels for ${what}`)
    .min(0, `${what} must be 0 px or more`);

/** A rectangle in pixels of the master image: the xywh of a media-fragment selector. */
export const rectSchema = z
  .object({
    x: px('x'),
    y: px('y'),
    w: px('width').min(1, 'Width must be at least 1 px'),
    h: px('height').min(1, 'Height must be at least 1 px'),
  })
  .strict();
export type Rect = z.infer<typeof rectSchema>;

export const regionCreateSchema = rectSchema
  .extend({
    purpose: z.enum(REGION_PURPOSES, { error: 'Choose what the region is for' }),
    label: z.string().trim().max(160, 'Use at most 160 characters').nullable().optional(),
  })
  .strict();
export const regionUpdateSchema = regionCreateSchema.partial().strict();
export type RegionCreateInput = z.infer<typeof regionCreateSchema>;
export type RegionUpdateInput = z.infer<typeof regionUpdateSchema>;

/**
 * How a photo's colours were read, recorded at upload: the embedded ICC profile's description (or
 * none, and then taken as sRGB), bits per channel and colour space as stored, and how the pixels
 * were converted to CIELAB ('icc-matrix': the profile's matrix and curves, unclipped;
 * 'lcms-perceptual': other profiles, through lcms to 8-bit sRGB; 'libvips': floating-point or Lab
 * files; 'none': sRGB as stored). CMYK photos are refused, so cmykConverted is always false.
 */
export const COLOUR_CONVERSIONS = ['icc-matrix', 'lcms-perceptual', 'libvips', 'none'] as const;
export const photoColourFactsSchema = z.object({
  profile: z.string().nullable(),
  assumedSrgb: z.boolean(),
  bitDepth: z.number(),
  colourSpace: z.string(),
  cmykConverted: z.boolean(),
  conversion: z.enum(COLOUR_CONVERSIONS),
});
export type PhotoColourFacts = z.infer<typeof photoColourFactsSchema>;

const CONVERSIONS: Record<PhotoColourFacts['conversion'], string> = {
  'icc-matrix': "read through the profile's matrix and curves, colours outside sRGB kept",
  'lcms-perceptual': 'converted to sRGB by lcms (perceptual intent)',
  libvips: 'converted to sRGB by libvips',
  none: 'read as sRGB',
};

/** The colour facts in plain words, one line each, for the photo's facts. */
export function colourFactsLines(facts: PhotoColourFacts | null): string[] {
  if (!facts) return ['Colour facts not recorded (uploaded before they were kept).'];
  return [
    facts.profile ? `Profile: ${facts.profile} (embedded)` : 'No embedded colour profile: taken as sRGB',
    `${facts.bitDepth} bits per channel, ${facts.colourSpace}${facts.cmykConverted ? ', converted from CMYK' : ''}`,
    `Colours ${CONVERSIONS[facts.conversion]}`,
  ];
}

export const paletteColourUpdateSchema = z.object({ background: z.boolean({ error: 'Say true or false' }) }).strict();

export const photoParams = idParams;
export const regionParams = photoParams.extend({ regionId: id });
export const colourParams = photoParams.extend({ colourId: id });
export const mediaParams = photoParams.extend({ kind: z.enum(PHOTO_KINDS) });

/** Problems with a rectangle against the photo's size, per field. */
export function rectIssues(r: Partial<Rect>, size: { width: number; height: number }) {
  const fields: Record<string, string[]> = {};
  if (r.x != null && r.w != null && r.x + r.w > size.width)
    fields.w = [`Reaches past the right edge (${size.width} px wide)`];
  if (r.y != null && r.h != null && r.y + r.h > size.height)
    fields.h = [`Reaches past the bottom edge (${size.height} px high)`];
  if (r.x != null && r.x >= size.width) fields.x = [`Must be less than ${size.width} px`];
  if (r.y != null && r.y >= size.height) fields.y = [`Must be less than ${size.height} px`];
  return fields;
}

/** The W3C Web Annotation selector for a rectangle. */
export const xywhSelector = (r: Rect) => ({
  type: 'FragmentSelector' as const,
  conformsTo: 'http://www.w3.org/TR/media-frags/',
  value: `xywh=pixel:${r.x},${r.y},${r.w},${r.h}`,
});

// ---- Responses (server/presenters/photo.ts returns these types; tsc checks the presenter against them) ----

/** A rectangle as stored (non-strict: the reference patch read back from the photo row). */
export const rectOut = z.object({ x: z.number(), y: z.number(), w: z.number(), h: z.number() });

/** One palette colour: an image estimate, CIELAB D65/2° (IMAGE_ESTIMATE_CONDITIONS). */
export const paletteColourSchema = z.object({
  id: z.number(),
  rank: z.number(),
  hex: z.string(),
  lab: z.object({ L: z.number(), a: z.number(), b: z.number() }),
  share: z.number(),
  spread: z.number(),
  name: z.string(),
  tradeName: z.string().nullable(),
  background: z.boolean(),
  source: z.literal('image-estimate'),
  illuminant: z.literal(IMAGE_ESTIMATE_CONDITIONS.illuminant),
  observer: z.literal(IMAGE_ESTIMATE_CONDITIONS.observer),
});
export type PaletteColourOut = z.infer<typeof paletteColourSchema>;

/** A photo's palettes grouped as { regionId, variant, colours }: whole photo first, then raw, corrected, calibrated. */
export const paletteGroupSchema = z.object({
  regionId: z.number().nullable(),
  variant: z.enum(PALETTE_VARIANTS),
  colours: z.array(paletteColourSchema),
});
export const palettesSchema = z.array(paletteGroupSchema);
export type Palettes = z.infer<typeof palettesSchema>;

export const regionSchema = z.object({
  id: z.number(),
  x: z.number(),
  y: z.number(),
  w: z.number(),
  h: z.number(),
  purpose: z.enum(REGION_PURPOSES),
  label: z.string().nullable(),
  selector: z.object({ type: z.literal('FragmentSelector'), conformsTo: z.string(), value: z.string() }),
});
export type RegionOut = z.infer<typeof regionSchema>;

const photoAbilities = z.object({
  'photo:update': z.boolean(),
  'photo:delete': z.boolean(),
  'region:create': z.boolean(),
  'region:update': z.boolean(),
  'region:delete': z.boolean(),
});

export const photoSchema = z.object({
  id: z.number(),
  pieceId: z.number().nullable(),
  width: z.number(),
  height: z.number(),
  format: z.string(),
  bytes: z.number(),
  sha256: z.string(),
  view: z.enum(PHOTO_VIEWS),
  caption: z.string().nullable(),
  originalName: z.string().nullable(),
  /** The camera's clock as written (no time zone), e.g. "2024-05-02T10:22:01". */
  capturedAt: z.string().nullable(),
  /** EXIF tags; GPS tags only for roles that may see them. */
  exif: z.record(z.string(), z.unknown()),
  /** Only for roles that may see GPS (photo:see-gps). */
  gps: z.object({ latitude: z.number(), longitude: z.number(), altitude: z.number().optional() }).nullable().optional(),
  referencePatch: rectOut.nullable(),
  /** The colour chart marked in the photo and its correction, or null. */
  chart: photoChartSchema.nullable(),
  /** The most trustworthy palette variant the photo has: the one shade search indexes and trials compare against. */
  trustedVariant: z.enum(PALETTE_VARIANTS),
  colour: photoColourFactsSchema.nullable(),
  /** The whole photo's raw palette, by rank. */
  palette: z.array(paletteColourSchema),
  palettes: palettesSchema,
  regions: z.array(regionSchema),
  /** `master` only for those the media route serves it to. */
  urls: z.object({ thumb: z.string(), display: z.string(), master: z.string().optional() }),
  /** Where the photo's processing stands (shared/schemas/ingest.ts): previews and palette exist once past them. */
  ingest: photoIngestSchema,
  abilities: photoAbilities,
});
export type PhotoOut = z.infer<typeof photoSchema>;

export const photoResponse = z.object({ photo: photoSchema });
export const photoUploadResponse = z.object({ photos: z.array(photoSchema) });
export const regionListResponse = z.object({ items: z.array(regionSchema) });
export const regionSavedResponse = z.object({ region: regionSchema, palettes: palettesSchema });
export const palettesResponse = z.object({ palettes: palettesSchema });
export const referencePatchResponse = z.object({ referencePatch: rectOut.nullable(), palettes: palettesSchema });
export const chartResponse = z.object({ chart: photoChartSchema.nullable(), palettes: palettesSchema });
export type ChartResponse = z.infer<typeof chartResponse>;
export type PhotoResponse = z.infer<typeof photoResponse>;
export type PhotoUploadResponse = z.infer<typeof photoUploadResponse>;
export type RegionSavedResponse = z.infer<typeof regionSavedResponse>;
export type PalettesResponse = z.infer<typeof palettesResponse>;
export type ReferencePatchResponse = z.infer<typeof referencePatchResponse>;
