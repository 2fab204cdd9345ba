import { z } from 'zod';
import '../messages.ts';
import { idParams } from './common.ts';

/**
 * The IIIF answers under /iiif (outside /api): Image API 3.0 info.json (https://iiif.io/api/image/3.0/),
 * Presentation API 3.0 manifests (https://iiif.io/api/presentation/3.0/) and W3C Web Annotation pages
 * (https://www.w3.org/TR/annotation-model/). Only the fields this app writes and reads are named;
 * the objects are loose, as a IIIF client may find more in them (sharp writes info.json).
 */

export const iiifPhotoParams = z.object({ photoId: idParams.shape.id });
export const iiifPieceParams = z.object({ pieceId: idParams.shape.id });

/** A language map: `{ en: ['…'] }` or `{ none: ['…'] }`. */
const langMap = z.record(z.string(), z.array(z.string()));
const metadataEntry = z.object({ label: langMap, value: langMap });

/** Image API 3.0 info.json of a photo's level-0 tiles, as sharp writes it, with `id` set to this server's URL. */
export const imageInfoSchema = z.looseObject({
  '@context': z.union([z.string(), z.array(z.string())]),
  id: z.string(),
  type: z.literal('ImageService3'),
  protocol: z.literal('http://iiif.io/api/image'),
  profile: z.string(),
  width: z.number(),
  height: z.number(),
  sizes: z.array(z.object({ width: z.number(), height: z.number() })).optional(),
  tiles: z
    .array(z.looseObject({ width: z.number(), height: z.number().optional(), scaleFactors: z.array(z.number()) }))
    .optional(),
});
export type ImageInfo = z.infer<typeof imageInfoSchema>;

/** A photo's region as a W3C Web Annotation tagging a canvas fragment (`…#xywh=x,y,w,h`, image pixels). */
export const regionAnnotationSchema = z.object({
  id: z.string(),
  type: z.literal('Annotation'),
  motivation: z.literal('tagging'),
  body: z.object({
    type: z.literal('TextualBody'),
    value: z.string(),
    format: z.literal('text/plain'),
    purpose: z.literal('tagging'),
  }),
  target: z.string(),
});
export const annotationPageSchema = z.object({
  '@context': z.string().optional(),
  id: z.string(),
  type: z.literal('AnnotationPage'),
  items: z.array(regionAnnotationSchema),
});
export type AnnotationPage = z.infer<typeof annotationPageSchema>;

/** The image painted on a canvas: the tiles' whole-image file with its level-0 service, or the display image. */
const paintingAnnotation = z.looseObject({
  id: z.string(),
  type: z.literal('Annotation'),
  motivation: z.literal('painting'),
  body: z.looseObject({
    id: z.string(),
    type: z.literal('Image'),
    format: z.string(),
    width: z.number(),
    height: z.number(),
    service: z.array(z.looseObject({ id: z.string(), type: z.string(), profile: z.string() })).optional(),
  }),
  target: z.string(),
});
const canvasSchema = z.looseObject({
  id: z.string(),
  type: z.literal('Canvas'),
  label: langMap,
  width: z.number(),
  height: z.number(),
  items: z.array(
    z.looseObject({ id: z.string(), type: z.literal('AnnotationPage'), items: z.array(paintingAnnotation) }),
  ),
  annotations: z.array(annotationPageSchema).optional(),
});

/** Presentation API 3.0 manifest of a piece: one canvas per photo, regions as tagging annotations. */
export const manifestSchema = z.looseObject({
  '@context': z.literal('http://iiif.io/api/presentation/3/context.json'),
  id: z.string(),
  type: z.literal('Manifest'),
  label: langMap,
  summary: langMap.optional(),
  metadata: z.array(metadataEntry),
  requiredStatement: metadataEntry.optional(),
  rights: z.string().optional(),
  items: z.array(canvasSchema),
});
export type Manifest = z.infer<typeof manifestSchema>;
