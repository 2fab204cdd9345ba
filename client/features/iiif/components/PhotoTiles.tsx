import { Link } from 'react-router-dom';
import { paths } from '../../../paths';
import { useMe } from '../../auth';
import { usePhotoJobs } from '../../jobs';
import { JobStatus } from './JobStatus';

/** The way into a photo's deep zoom, with the state of its tiling job while it is not done (signed-in users only see jobs). */
export function PhotoTiles({ photoId }: { photoId: number }) {
  const me = useMe();
  const jobs = usePhotoJobs(photoId, Boolean(me.data));
  const job = jobs.data?.items[0];
  // Signed-in users wait for the job list, so a photo whose tiling failed never offers a zoom that cannot open.
  if (me.isPending || (me.data && jobs.isPending)) return null;
  const ready = !job || job.state === 'done';
  return (
    <div className="flex flex-wrap items-start gap-3">
      {ready ? (
        <Link
          to={paths.photoZoom(photoId)}
          className="rounded-md border border-rule-strong bg-sheet px-3 py-1.5 text-sm hover:bg-paper"
        >
          Zoom in (deep zoom with regions)
        </Link>
      ) : (
        <div className="w-full max-w-md">
          <JobStatus job={job} title="Processing (previews, palette, deep-zoom tiles)" />
        </div>
      )}
    </div>
  );
}
