import { pixelsInWords, sizeInWords } from '../../shared/schemas/photo.ts';
import { env } from '../env.ts';

/**
 * The limits of one image file, read from server/env.ts (MEDIA_MAX_BYTES, MEDIA_MAX_PIXELS). Read at each use, so
 * tests may lower them for a moment to check the refusals without sending gigabytes.
 */
export const mediaLimits = {
  maxBytes: env.MEDIA_MAX_BYTES,
  maxPixels: env.MEDIA_MAX_PIXELS,
  /** Progressive JPEG, interlaced PNG, HEIF/AVIF: decoded whole, so held to a lower count (server/env.ts). */
  maxPixelsDecodedWhole: env.MEDIA_MAX_PIXELS_DECODED_WHOLE,
};

export const maxBytesInWords = () => sizeInWords(mediaLimits.maxBytes);
export const maxPixelsInWords = (pixels = mediaLimits.maxPixels) => pixelsInWords(pixels);
