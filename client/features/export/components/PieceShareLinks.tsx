import { useCan } from '../../auth';
import { manifestUrl } from '../../iiif';
import { exportUrls } from '../urls';
import { DownloadLink } from './DownloadLink';

/** Getting a piece out: its IIIF manifest once published, its palettes to anyone who reads it, and (for those allowed to export) Dublin Core and the masters. */
export function PieceShareLinks({
  pieceId,
  published,
  hasPhotos,
}: {
  pieceId: number;
  published: boolean;
  hasPhotos: boolean;
}) {
  const can = useCan();
  const mayExport = can('export:run');
  return (
    <section aria-labelledby="share-heading" className="rounded-lg border border-rule bg-sheet p-4">
      <h2 id="share-heading" className="font-serif text-lg">
        Share and export
      </h2>
      <div className="mt-3 flex flex-wrap items-center gap-2">
        {published ? (
          <a
            href={manifestUrl(pieceId)}
            className="rounded-md border border-rule-strong bg-sheet px-3 py-1.5 text-sm hover:bg-paper"
            data-testid="iiif-manifest-link"
          >
            IIIF manifest
          </a>
        ) : null}
        {hasPhotos ? (
          <DownloadLink
            href={exportUrls.piecePalettesCsv(pieceId)}
            hint="Each photo's palettes: region, variant, L*a*b* (image estimate, D65/2°), hex and share"
          >
            Palettes (CSV)
          </DownloadLink>
        ) : null}
        {mayExport ? (
          <>
            <DownloadLink
              href={exportUrls.dublinCore(pieceId)}
              hint="The catalogue record as Dublin Core terms in JSON-LD"
            >
              Dublin Core (JSON-LD)
            </DownloadLink>
            {hasPhotos ? (
              <DownloadLink
                href={exportUrls.mastersZip(pieceId)}
                hint="Every master file, untouched, with a SHA-256 fixity manifest"
              >
                Masters (ZIP with fixity manifest)
              </DownloadLink>
            ) : null}
          </>
        ) : null}
      </div>
      {published ? (
        <p className="mt-2 text-xs text-ink-soft">
          The IIIF manifest opens in any IIIF Presentation 3 viewer; copy its address to share the images.
        </p>
      ) : (
        <p className="mt-2 text-xs text-ink-soft">A IIIF manifest is offered once the piece is published.</p>
      )}
    </section>
  );
}
