import type { AnnotationPage, Manifest } from '../../shared/schemas/iiif.ts';
import type { Photo, Piece, Region } from '../models/index.ts';
import { iiifPrefix } from './files.ts';
import { readText, storage } from '../storage/index.ts';
import { rightsLabel } from '../../shared/rights.ts';

// IIIF Presentation API 3.0 (https://iiif.io/api/presentation/3.0/) built from a piece;
// regions become W3C Web Annotations targeting a canvas fragment (Media Fragments xywh).
const lang = (value: string) => ({ none: [value] });
const en = (value: string) => ({ en: [value] });
const entry = (label: string, value: string) => ({ label: en(label), value: lang(value) });
const terms = (list: Array<{ name: string; evidence: string }>) =>
  list.map((t) => `${t.name} (${t.evidence})`).join('; ');

export type TileInfo = { width: number; height: number; full: string | null };

/** The size the tiles were built at (auto-oriented) and the one whole-image size sharp wrote; else the photo row. */
export async function tileInfo(photo: Photo): Promise<TileInfo> {
  if (photo.ingestStage === 'done') {
    try {
      const prefix = iiifPrefix(photo.id);
      const info = JSON.parse(await readText(`${prefix}info.json`));
      let full: string | null = null;
      for await (const o of storage().list(`${prefix}full/`)) {
        full = o.key.slice(`${prefix}full/`.length).split('/')[0];
        break;
      }
      return { width: Number(info.width), height: Number(info.height), full };
    } catch {
      // tiles missing in storage although marked done: fall back to the stored size and the display image
    }
  }
  return { width: photo.width, height: photo.height, full: null };
}

/** A photo's regions as W3C Web Annotations on a canvas fragment (Media Fragments xywh, in image pixels). */
export function regionAnnotationPage(
  canvasId: string,
  regions: Region[],
  pageId = `${canvasId}/page/regions`,
): AnnotationPage {
  return {
    id: pageId,
    type: 'AnnotationPage',
    items: regions.map((r) => ({
      id: `${canvasId}/annotation/region-${r.id}`,
      type: 'Annotation',
      motivation: 'tagging',
      body: { type: 'TextualBody', value: r.label ?? r.purpose, format: 'text/plain', purpose: 'tagging' },
      target: `${canvasId}#xywh=${r.x},${r.y},${r.w},${r.h}`,
    })),
  };
}

export async function buildManifest(
  base: string,
  piece: Piece,
  photos: Array<Photo & { regions?: Region[] }>,
): Promise<Manifest> {
  const id = `${base}/iiif/${piece.id}/manifest.json`;
  const metadata = [
    entry('Accession number', piece.accessionNumber),
    entry('Object name', piece.objectName),
    ...(piece.dateText || piece.dateEdtf ? [entry('Date', piece.dateText ?? piece.dateEdtf ?? '')] : []),
    ...(piece.place ? [entry('Place', piece.place)] : []),
    ...(piece.techniques.length ? [entry('Techniques', piece.techniques.join('; '))] : []),
    ...(piece.dyestuffs.length ? [entry('Dyestuffs', terms(piece.dyestuffs))] : []),
    ...(piece.historicalMordants.length ? [entry('Mordants', terms(piece.historicalMordants))] : []),
    ...(piece.fibres.length ? [entry('Fibres', piece.fibres.join('; '))] : []),
    ...(piece.patternName ? [entry('Pattern name', piece.patternName)] : []),
    ...(piece.makers?.length ? [entry('Makers', makerList(piece))] : []),
    ...(piece.marks?.length ? [entry('Marks and inscriptions', markList(piece))] : []),
    ...(piece.objectRights
      ? [entry('Object rights', `${rightsLabel(piece.objectRights)} (${piece.objectRights})`)]
      : []),
    // storageLocation is never here: the manifest is public.
  ];
  const items: Manifest['items'] = [];
  for (const photo of photos) {
    const { width, height, full } = await tileInfo(photo);
    const canvasId = `${base}/iiif/${piece.id}/canvas/${photo.id}`;
    const service = `${base}/iiif/photos/${photo.id}`;
    const body = full
      ? {
          id: `${service}/full/${full}/0/default.jpg`,
          type: 'Image' as const,
          format: 'image/jpeg',
          service: [{ id: service, type: 'ImageService3', profile: 'level0' }],
        }
      : { id: `${base}/media/photos/${photo.id}/display`, type: 'Image' as const, format: 'image/webp' };
    const regions = photo.regions ?? [];
    items.push({
      id: canvasId,
      type: 'Canvas',
      label: en(`${photo.view}${photo.caption ? ` — ${photo.caption}` : ''}`),
      width,
      height,
      items: [
        {
          id: `${canvasId}/page/painting`,
          type: 'AnnotationPage',
          items: [
            {
              id: `${canvasId}/annotation/painting`,
              type: 'Annotation',
              motivation: 'painting',
              body: { ...body, ...bodySize(full, width, height) },
              target: canvasId,
            },
          ],
        },
      ],
      ...(regions.length ? { annotations: [regionAnnotationPage(canvasId, regions)] } : {}),
    });
  }
  return {
    '@context': 'http://iiif.io/api/presentation/3/context.json',
    id,
    type: 'Manifest',
    label: en(piece.title),
    ...(piece.description ? { summary: en(piece.description) } : {}),
    metadata,
    ...rightsOf(piece),
    items,
  };
}

const makerList = (p: Piece) =>
  (p.makers ?? []).map((m) => `${m.name} (${m.role}${m.dates ? `, ${m.dates}` : ''})`).join('; ');
const markList = (p: Piece) =>
  (p.marks ?? []).map((m) => `${m.kind}: “${m.text}”${m.place ? ` (${m.place})` : ''}`).join('; ');

/**
 * `rights` takes one URI (Presentation 3.0 §3.3 rights): the manifest delivers the photographs, so it carries the
 * images' rights (imageRights); the object's own rights go in metadata and in the requiredStatement beside the credit
 * line. Without imageRights the manifest has no `rights` rather than one that may not fit the images.
 */
export function rightsOf(piece: Piece) {
  const lines = [
    piece.creditLine,
    piece.imageRights ? `Images: ${rightsLabel(piece.imageRights)}` : null,
    piece.objectRights ? `Object: ${rightsLabel(piece.objectRights)}` : null,
  ].filter((l): l is string => Boolean(l));
  return {
    ...(piece.imageRights ? { rights: piece.imageRights } : {}),
    ...(lines.length
      ? { requiredStatement: { label: en(piece.creditLine ? 'Credit line' : 'Rights'), value: { none: lines } } }
      : {}),
  };
}

// The whole-image file of a level-0 service is the reduced size its folder is named after.
function bodySize(full: string | null, width: number, height: number) {
  const m = full?.match(/^(\d+),(\d+)$/);
  return m ? { width: Number(m[1]), height: Number(m[2]) } : { width, height };
}
