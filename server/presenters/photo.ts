import { IMAGE_ESTIMATE_CONDITIONS } from '../../shared/colour/conditions.ts';
import {
  xywhSelector,
  type PaletteColourOut,
  type Palettes,
  type PhotoOut,
  type RegionOut,
} from '../../shared/schemas/photo.ts';
import type { PhotoIngest } from '../../shared/schemas/ingest.ts';
import type { PaletteColour, Photo, Region } from '../models/index.ts';
import { PALETTE_VARIANTS, VARIANT_TRUST, type PaletteVariant } from '../../shared/schemas/chart.ts';
import { abilities, can, type Actor } from '../policies/index.ts';

export const mediaUrl = (id: number, kind: 'thumb' | 'display' | 'master') => `/media/photos/${id}/${kind}`;

export function presentColour(c: PaletteColour): PaletteColourOut {
  return {
    id: c.id,
    rank: c.rank,
    hex: c.hex,
    lab: { L: c.L, a: c.a, b: c.b },
    share: c.share,
    spread: c.spread,
    name: c.name,
    tradeName: c.tradeName,
    background: c.background,
    // Computed from the photo's RGB colour space: CIELAB D65, 2° observer.
    source: 'image-estimate' as const,
    ...IMAGE_ESTIMATE_CONDITIONS,
  };
}

export function presentRegion(r: Region): RegionOut {
  return { id: r.id, x: r.x, y: r.y, w: r.w, h: r.h, purpose: r.purpose, label: r.label, selector: xywhSelector(r) };
}

/** The most trustworthy variant among a photo's palette rows (calibrated, then corrected, then raw). */
export const trustedVariant = (rows: PaletteColour[]): PaletteVariant =>
  VARIANT_TRUST.find((v) => rows.some((r) => r.variant === v)) ?? 'raw';

/** Palettes of one photo grouped as { regionId, variant, colours }, whole photo first, then raw, corrected, calibrated. */
export function presentPalettes(rows: PaletteColour[]): Palettes {
  const groups = new Map<string, Palettes[number]>();
  const sorted = [...rows].sort(
    (x, y) =>
      (x.regionId ?? 0) - (y.regionId ?? 0) ||
      PALETTE_VARIANTS.indexOf(x.variant) - PALETTE_VARIANTS.indexOf(y.variant) ||
      x.rank - y.rank,
  );
  for (const c of sorted) {
    const key = `${c.regionId ?? 'photo'}:${c.variant}`;
    if (!groups.has(key)) groups.set(key, { regionId: c.regionId, variant: c.variant, colours: [] });
    groups.get(key)!.colours.push(presentColour(c));
  }
  return [...groups.values()];
}

/** A photo's processing as the API shows it: the stage, and the reason only when it failed. */
export const presentIngest = (p: Photo): PhotoIngest => ({
  stage: p.ingestStage,
  error: p.ingestStage === 'failed' ? (p.ingestError ?? 'The processing failed.') : null,
});

/**
 * Whether a photo may carry GPS, for the master rule (photo:master): it does when its EXIF gave a position, and it
 * may when its EXIF has not been read yet (the reading step writes the display derivative with it).
 */
export const mayCarryGps = (p: Photo) => p.gps != null || !p.derivatives.display;

const GPS_KEY = /^gps|latitude|longitude|altitude/i;

/** EXIF as a role may see it: GPS only for roles allowed to (curators and admins). */
export function presentExif(exif: Record<string, unknown>, seeGps: boolean) {
  return seeGps ? exif : Object.fromEntries(Object.entries(exif ?? {}).filter(([k]) => !GPS_KEY.test(k)));
}

export function presentPhoto(
  p: Photo,
  actor: Actor,
  extra: { palette: PaletteColour[]; regions?: Region[] },
): PhotoOut {
  const seeGps = can(actor, 'photo:see-gps');
  const wholeRaw = extra.palette
    .filter((c) => c.regionId == null && c.variant === 'raw')
    .sort((x, y) => x.rank - y.rank);
  return {
    id: p.id,
    pieceId: p.pieceId,
    width: p.width,
    height: p.height,
    format: p.format,
    bytes: p.bytes,
    sha256: p.sha256,
    view: p.view,
    caption: p.caption,
    originalName: p.originalName,
    capturedAt: p.capturedAt,
    exif: presentExif(p.exif, seeGps),
    ...(seeGps ? { gps: p.gps } : {}),
    referencePatch: p.referencePatch,
    chart: p.chart ?? null,
    trustedVariant: trustedVariant(extra.palette),
    colour: p.colour ?? null,
    palette: wholeRaw.map(presentColour),
    palettes: presentPalettes(extra.palette),
    regions: (extra.regions ?? []).map(presentRegion),
    // The master's link only for those the media route serves it to, so nobody follows a link into a refusal.
    urls: {
      thumb: mediaUrl(p.id, 'thumb'),
      display: mediaUrl(p.id, 'display'),
      ...(can(actor, 'photo:master', { hasGps: mayCarryGps(p) }) ? { master: mediaUrl(p.id, 'master') } : {}),
    },
    ingest: presentIngest(p),
    abilities: abilities(actor, [
      'photo:update',
      'photo:delete',
      'region:create',
      'region:update',
      'region:delete',
    ] as const),
  };
}
