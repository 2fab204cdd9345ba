import { useEffect, useRef, useState } from 'react';
import type OpenSeadragonNS from 'openseadragon';
import { Button } from '../../../components/Button';
import { infoJsonUrl, type RegionBox } from '../api';

type Viewer = OpenSeadragonNS.Viewer;

/**
 * Deep zoom into one photo from its IIIF tiles (OpenSeadragon, loaded on demand),
 * with the photo's regions drawn as outlined rectangles. Own buttons instead of
 * OpenSeadragon's image buttons, so the controls are keyboard-usable and need no icon files.
 */
export function DeepZoomViewer({
  photoId,
  regions = [],
  label,
}: {
  photoId: number;
  regions?: RegionBox[];
  label: string;
}) {
  const host = useRef<HTMLDivElement>(null);
  const viewer = useRef<Viewer | null>(null);
  const [zoom, setZoom] = useState<number | null>(null);
  const [opened, setOpened] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [showRegions, setShowRegions] = useState(true);

  useEffect(() => {
    let cancelled = false;
    void import('openseadragon').then(({ default: OpenSeadragon }) => {
      if (cancelled || !host.current) return;
      const v = OpenSeadragon({
        element: host.current,
        tileSources: infoJsonUrl(photoId),
        showNavigationControl: false,
        gestureSettingsMouse: { clickToZoom: false },
        // The canvas drawer needs no GPU and keeps overlays in step on modest tablets.
        drawer: 'canvas',
        maxZoomPixelRatio: 2,
        visibilityRatio: 0.8,
      });
      v.addHandler('open', () => {
        setZoom(v.viewport.getZoom(true));
        setOpened(true);
      });
      v.addHandler('zoom', (e) => setZoom((e as unknown as { zoom: number }).zoom));
      v.addHandler('open-failed', () =>
        setError('The deep-zoom tiles could not be opened. They may still be building.'),
      );
      viewer.current = v;
    });
    return () => {
      cancelled = true;
      viewer.current?.destroy();
      viewer.current = null;
      setOpened(false);
    };
  }, [photoId]);

  // Overlays follow the regions and the show/hide toggle once the image is open.
  useEffect(() => {
    const v = viewer.current;
    if (!v || !opened) return;
    v.clearOverlays();
    if (!showRegions) return;
    const item = v.world.getItemAt(0);
    if (!item) return;
    for (const r of regions) {
      const el = document.createElement('div');
      el.className = 'border-2 border-white outline outline-1 outline-black/70';
      el.title = r.label;
      el.dataset.region = r.label;
      el.setAttribute('aria-label', `Region: ${r.label}`);
      v.addOverlay({ element: el, location: item.imageToViewportRectangle(r.x, r.y, r.w, r.h) });
    }
  }, [regions, showRegions, opened]);

  const act = (fn: (v: Viewer) => void) => () => {
    if (viewer.current) fn(viewer.current);
  };

  return (
    <figure className="rounded-lg border border-rule bg-neutral-light">
      <div className="flex flex-wrap items-center gap-2 border-b border-rule bg-sheet px-3 py-2 text-sm">
        <Button
          variant="secondary"
          onClick={act((v) => v.viewport.zoomBy(1.6).applyConstraints())}
          aria-label="Zoom in"
        >
          +
        </Button>
        <Button
          variant="secondary"
          onClick={act((v) => v.viewport.zoomBy(1 / 1.6).applyConstraints())}
          aria-label="Zoom out"
        >
          −
        </Button>
        <Button variant="secondary" onClick={act((v) => v.viewport.goHome())}>
          Whole photo
        </Button>
        <label className="ml-2 inline-flex items-center gap-2">
          <input type="checkbox" checked={showRegions} onChange={(e) => setShowRegions(e.target.checked)} />
          Show regions <span className="num text-ink-faint">({regions.length})</span>
        </label>
        <span className="ml-auto num text-ink-soft" data-testid="zoom-level" data-zoom={zoom ?? ''}>
          {zoom === null ? 'opening…' : `zoom × ${zoom.toFixed(2)}`}
        </span>
      </div>
      {/* Mid-grey ground: colour judgements are biased by tinted surroundings. */}
      <div
        ref={host}
        className="h-[70vh] min-h-80 w-full bg-neutral-ground"
        role="img"
        aria-label={label}
        data-testid="deep-zoom"
      />
      {error ? (
        <figcaption className="px-3 py-2 text-sm text-danger" role="alert">
          {error}
        </figcaption>
      ) : null}
    </figure>
  );
}
