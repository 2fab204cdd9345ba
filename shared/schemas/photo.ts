import { z } from 'zod';
import '../messages.ts';

export const PHOTO_VIEWS = ['recto', 'verso', 'detail', 'raking', 'transmitted', 'uv', 'swatch'] as const;
// W3C Web Annotation motivations narrowed to what a region is for on a textile photo.
export const REGION_PURPOSES = ['colour-area', 'motif', 'exclusion', 'reference-patch', 'sampling-site'] as const;
export type RegionPurpose = (typeof REGION_PURPOSES)[number];
export const PHOTO_KINDS = ['thumb', 'display', 'master'] as const;

/** Upload limit per file, in bytes (60 MB). */
export const MAX_UPLOAD_BYTES = 60 * 1024 * 1024;
export const UPLOAD_FIELD = 'photo';

export const photoUpdateSchema = z
  .object({
    caption: z.string().trim().max(255, 'Use at most 255 characters').nullable().optional(),
    view: z.enum(PHOTO_VIEWS, { error: 'Choose a view' }).optional(),
  })
  .strict();
export type PhotoUpdateInput = z.infer<typeof photoUpdateSchema>;

const px = (what: string) => z.number({ error: `Enter ${what} in pixels` }).int(`Use whole pixels for ${what}`).min(0, `${what} must be 0 px or more`);

/** A rectangle in pixels of the master image: the xywh of a media-fragment selector. */
export const rectSchema = z
  .object({ x: px('x'), y: px('y'), w: px('width').min(1, 'Width must be at least 1 px'), h: px('height').min(1, 'Height must be at least 1 px') })
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
export type PhotoColourFacts = {
  profile: string | null;
  assumedSrgb: boolean;
  bitDepth: number;
  colourSpace: string;
  cmykConverted: boolean;
  conversion: 'icc-matrix' | 'lcms-perceptual' | 'libvips' | 'none';
};

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

export const photoParams = z.object({ id: z.coerce.number().int().positive() });
export const regionParams = photoParams.extend({ regionId: z.coerce.number().int().positive() });
export const colourParams = photoParams.extend({ colourId: z.coerce.number().int().positive() });
export const mediaParams = photoParams.extend({ kind: z.enum(PHOTO_KINDS) });

/** Problems with a rectangle against the photo's size, per field. */
export function rectIssues(r: Partial<Rect>, size: { width: number; height: number }) {
  const fields: Record<string, string[]> = {};
  if (r.x != null && r.w != null && r.x + r.w > size.width) fields.w = [`Reaches past the right edge (${size.width} px wide)`];
  if (r.y != null && r.h != null && r.y + r.h > size.height) fields.h = [`Reaches past the bottom edge (${size.height} px high)`];
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
