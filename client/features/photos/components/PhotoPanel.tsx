import { exifLines, formatBytes, formatLocalDateTime, type ExifFacts } from '../../../../shared/format';
import { useState } from 'react';
import { colourFactsLines } from '../../../../shared/schemas/photo';
import { VARIANT_WORDS } from '../../../../shared/schemas/chart';
import { ChartPanel } from './ChartPanel';
import type { Photo } from '../../pieces';
import { useDeletePhoto, useDeleteRegion, useReferencePatch, useToggleBackground } from '../api';
import { PhotoTiles } from '../../iiif';
import { IngestStatus } from './IngestStatus';
import { PaletteBar } from './PaletteBar';
import { PURPOSE_LABELS, RegionEditor } from './RegionEditor';

/**
 * One photo: the image with its regions or its colour chart, its palettes (raw, corrected, calibrated, labelled), and
 * its facts; while it is still being processed, a placeholder with the stage (IngestStatus).
 */
export function PhotoPanel({ photo }: { photo: Photo }) {
  const removePhoto = useDeletePhoto(photo);

  return (
    <article className="space-y-4 rounded-lg border border-rule bg-sheet p-4" data-testid="photo-panel">
      <header className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="font-serif text-lg">
          {photo.view} ·{' '}
          <span className="num">
            {photo.width} × {photo.height} px
          </span>
        </h3>
        <div className="flex gap-3 text-sm">
          {photo.urls.master ? (
            <a className="text-action hover:underline" href={photo.urls.master}>
              Master file
            </a>
          ) : null}
          {photo.abilities['photo:delete'] ? (
            <button
              type="button"
              className="text-danger hover:underline"
              onClick={() => confirm('Remove this photo and its palettes?') && removePhoto.mutate()}
            >
              Remove photo
            </button>
          ) : null}
        </div>
      </header>
      {photo.ingest.stage !== 'done' ? <IngestStatus photo={photo} /> : <PhotoBody photo={photo} />}
    </article>
  );
}

/** A processed photo: the image with its regions or colour chart, its palettes, and its facts. */
function PhotoBody({ photo }: { photo: Photo }) {
  const canEdit = photo.abilities['region:create'];
  const toggle = useToggleBackground(photo);
  const removeRegion = useDeleteRegion(photo);
  const clearPatch = useReferencePatch(photo);
  const [chartMode, setChartMode] = useState(photo.chart != null);
  const regionName = (id: number | null) => {
    if (id == null) return 'Whole photo';
    const r = photo.regions.find((x) => x.id === id);
    return r ? `Region: ${r.label ?? PURPOSE_LABELS[r.purpose]}` : 'Region';
  };
  return (
    <>
      <div className="flex flex-wrap gap-2 text-sm" role="group" aria-label="Photo mode">
        <button
          type="button"
          aria-pressed={!chartMode}
          className={`rounded border px-3 py-1 ${!chartMode ? 'border-action text-action' : 'border-rule-strong'}`}
          onClick={() => setChartMode(false)}
        >
          Regions
        </button>
        <button
          type="button"
          aria-pressed={chartMode}
          className={`rounded border px-3 py-1 ${chartMode ? 'border-action text-action' : 'border-rule-strong'}`}
          onClick={() => setChartMode(true)}
        >
          Colour chart
        </button>
        <span className="self-center text-ink-soft" data-testid="variant-in-use">
          Palette in use for shade search and trials: <strong>{VARIANT_WORDS[photo.trustedVariant]}</strong>
        </span>
      </div>
      {chartMode ? <ChartPanel photo={photo} canEdit={canEdit} /> : <RegionEditor photo={photo} canEdit={canEdit} />}
      <PhotoTiles photoId={photo.id} />

      <div className="space-y-3">
        {photo.palettes.length === 0 ? <p className="text-sm text-ink-soft">No palette yet.</p> : null}
        {photo.palettes.map((p) => (
          <PaletteBar
            key={`${p.regionId}-${p.variant}`}
            title={`${regionName(p.regionId)} — ${VARIANT_WORDS[p.variant]}${p.variant === photo.trustedVariant ? ' (in use)' : ''}`}
            colours={p.colours}
            pieceId={photo.pieceId}
            onToggleBackground={
              canEdit ? (c) => toggle.mutate({ colourId: c.id, background: !c.background }) : undefined
            }
          />
        ))}
      </div>

      {photo.regions.length || photo.referencePatch ? (
        <ul className="space-y-1 text-sm">
          {photo.regions.map((r) => (
            <li key={r.id} className="flex flex-wrap gap-2">
              <span>
                {PURPOSE_LABELS[r.purpose]}
                {r.label ? `: ${r.label}` : ''}
              </span>
              <span className="font-mono text-xs text-ink-soft">{r.selector.value}</span>
              {canEdit ? (
                <button type="button" className="text-action hover:underline" onClick={() => removeRegion.mutate(r.id)}>
                  Remove
                </button>
              ) : null}
            </li>
          ))}
          {photo.referencePatch ? (
            <li className="flex flex-wrap gap-2">
              <span>grey reference patch</span>
              <span className="font-mono text-xs text-ink-soft">
                xywh=pixel:{photo.referencePatch.x},{photo.referencePatch.y},{photo.referencePatch.w},
                {photo.referencePatch.h}
              </span>
              {canEdit ? (
                <button type="button" className="text-action hover:underline" onClick={() => clearPatch.mutate(null)}>
                  Remove
                </button>
              ) : null}
            </li>
          ) : null}
        </ul>
      ) : null}

      <details className="text-xs text-ink-soft">
        <summary className="cursor-pointer">File facts</summary>
        <p className="mt-1 font-mono break-all">SHA-256 (fixity) {photo.sha256}</p>
        <p className="num">
          {photo.format} · {formatBytes(photo.bytes)}
          {photo.capturedAt ? ` · taken ${formatLocalDateTime(photo.capturedAt)}` : ''}
        </p>
        <ul data-testid="colour-facts">
          {colourFactsLines(photo.colour).map((l) => (
            <li key={l}>{l}</li>
          ))}
        </ul>
        <dl className="grid grid-cols-[auto_1fr] gap-x-3" data-testid="exif">
          {exifLines(photo.exif as ExifFacts).map((l) => (
            <div key={l.label} className="contents">
              <dt className="text-ink-soft">{l.label}</dt>
              <dd className="num">{l.value}</dd>
            </div>
          ))}
        </dl>
        {'gps' in photo && photo.gps ? (
          <p className="num">
            GPS {photo.gps.latitude.toFixed(5)}, {photo.gps.longitude.toFixed(5)} (shown to curators and admins only)
          </p>
        ) : null}
      </details>
    </>
  );
}
