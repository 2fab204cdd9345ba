import { Link, useParams } from 'react-router-dom';
import { Page } from '../components/Page';
import { useMe } from '../features/auth/api';
import { usePhotoJobs } from '../features/jobs/api';
import { usePhotoRegions } from '../features/iiif/api';
import { DeepZoomViewer } from '../features/iiif/components/DeepZoomViewer';
import { JobStatus } from '../features/iiif/components/JobStatus';
import { usePhoto } from '../features/photos/api';
import { usePiece } from '../features/pieces/api';
import { paths } from '../paths';
import { NotFound } from './NotFound';

/** One photo in deep zoom, with its regions and (for staff) the state of its tiling job. */
export function PhotoZoom() {
  const photoId = Number(useParams().photoId);
  const me = useMe();
  const signedIn = Boolean(me.data);
  const jobs = usePhotoJobs(photoId, Number.isSafeInteger(photoId) && signedIn);
  const regions = usePhotoRegions(photoId);
  const valid = Number.isSafeInteger(photoId) && photoId > 0;
  // The photo API is for signed-in users; visitors see the tiles and regions without the piece's name.
  const photo = usePhoto(photoId, valid && signedIn).data?.photo;
  const piece = usePiece(photo?.pieceId ?? 0, photo?.pieceId != null).data?.piece;
  if (!valid || (regions.isError && !regions.data)) return <NotFound />;
  const job = jobs.data?.items[0];
  const tilesReady = !job || job.state === 'done';
  return (
    <Page
      title={piece ? `${piece.accessionNumber} · ${photo?.caption ?? photo?.view ?? 'photo'}` : `Photo ${photoId}`}
      lead={
        <>
          {piece ? (
            <Link to={paths.piece(piece.id)} className="text-action hover:underline">
              ← {piece.title}
            </Link>
          ) : null}{' '}
          Deep zoom from the IIIF tiles. Drag to pan, scroll or use the buttons to zoom; outlined rectangles are the
          photo&apos;s regions.
        </>
      }
    >
      {job && job.state !== 'done' ? (
        <div className="mb-4 max-w-md">
          <JobStatus job={job} title="Processing (previews, palette, deep-zoom tiles)" />
        </div>
      ) : null}
      {tilesReady && !me.isPending ? (
        <DeepZoomViewer photoId={photoId} regions={regions.data ?? []} label={`Photo ${photoId} in deep zoom`} />
      ) : null}
    </Page>
  );
}
