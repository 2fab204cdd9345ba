import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AnnotationPage } from '../../../shared/schemas/iiif';
import { http } from '../../lib/http';

export type RegionBox = { id: string; label: string; x: number; y: number; w: number; h: number };

export const iiifKeys = {
  regions: (photoId: number) => ['iiif', 'photo', photoId, 'regions'] as const,
};

// Image API 3 service of a photo's tiles; OpenSeadragon reads its info.json itself.
export const infoJsonUrl = (photoId: number) => `/iiif/photos/${photoId}/info.json`;
export const manifestUrl = (pieceId: number) => `/iiif/${pieceId}/manifest.json`;

/** A photo's regions, read from its W3C annotation page (targets are canvas#xywh=x,y,w,h in image pixels). */
export async function fetchRegions(photoId: number): Promise<RegionBox[]> {
  const page = await http<AnnotationPage>(`/iiif/photos/${photoId}/annotations.json`);
  return page.items.flatMap((a) => {
    const m = /#xywh=(\d+),(\d+),(\d+),(\d+)$/.exec(a.target);
    return m
      ? [{ id: a.id, label: a.body.value, x: Number(m[1]), y: Number(m[2]), w: Number(m[3]), h: Number(m[4]) }]
      : [];
  });
}
export const regionsQuery = (photoId: number) =>
  queryOptions({ queryKey: iiifKeys.regions(photoId), queryFn: () => fetchRegions(photoId) });
export const usePhotoRegions = (photoId: number) => useQuery(regionsQuery(photoId));
