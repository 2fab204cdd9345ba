import type { RouteGroup } from '../registry.ts';
import pieces from './pieces.ts';
import photos from './photos.ts';
import search from './search.ts';
import iiif from './iiif.ts';
import media from './media.ts';

// One import per route group, in the order of server/routes/index.ts (then /iiif and /media, mounted in server/app.ts).
export const groups: RouteGroup[] = [
  pieces,
  photos,
  search,
  iiif,
  media,
];
