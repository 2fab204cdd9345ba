import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { Button } from '../components/Button';
import { Page } from '../components/Page';
import { PieceTrialLinks } from '../features/trials/components/PieceTrialLinks';
import { useDeletePiece, usePiece, useRestorePiece, useUpdatePiece } from '../features/pieces/api';
import { StatusBadge } from '../features/pieces/components/ArchiveTable';
import { PieceFacts } from '../features/pieces/components/PieceFacts';
import { PieceHistory } from '../features/pieces/components/PieceHistory';
import { PieceShareLinks } from '../features/export/components/PieceShareLinks';
import { PhotoPanel } from '../features/photos/components/PhotoPanel';
import { UploadPanel } from '../features/photos/components/UploadPanel';
import { paths } from '../paths';
import { FadingPairs } from '../features/fading';
import { PieceReadings } from '../features/trials';
import { AnalysesPanel, ConditionPanel, LightPanel } from '../features/records';
import { useCan } from '../features/auth';

export function PieceDetailPage() {
  const id = Number(useParams().id);
  const detail = usePiece(id);
  const update = useUpdatePiece(id);
  const remove = useDeletePiece(id);
  const restore = useRestorePiece(id);
  const navigate = useNavigate();
  const allowed = useCan();
  const [showHistory, setShowHistory] = useState(false);
  const signedIn = useCan()('condition:read');
  if (detail.isPending) return <p>Loading…</p>;
  if (detail.isError)
    return <Page title="Piece not found" lead="There is no such piece, or it is not published yet." />;
  const { piece, photos } = detail.data;
  const can = piece.abilities;
  const deleted = piece.deletedAt != null;
  const error = update.error ?? remove.error ?? restore.error;

  return (
    <Page
      title={piece.title}
      documentTitle={piece.accessionNumber}
      lead={
        <span className="flex flex-wrap items-center gap-2">
          <span className="font-mono">{piece.accessionNumber}</span> · {piece.objectName}{' '}
          <StatusBadge status={piece.status} deleted={deleted} />
        </span>
      }
      actions={
        <>
          {!deleted ? <PieceTrialLinks pieceId={id} /> : null}
          {can['piece:update'] && !deleted ? (
            <Link
              to={paths.pieceEdit(id)}
              className="rounded-md border border-rule-strong bg-sheet px-4 py-2 text-sm font-medium hover:bg-paper"
            >
              Edit
            </Link>
          ) : null}
          {can['piece:publish'] && !deleted ? (
            <Button
              variant="secondary"
              disabled={update.isPending}
              onClick={() => update.mutate({ status: piece.status === 'published' ? 'draft' : 'published' })}
            >
              {piece.status === 'published' ? 'Unpublish' : 'Publish'}
            </Button>
          ) : null}
          {can['piece:delete'] && !deleted ? (
            <Button
              variant="danger"
              onClick={() =>
                confirm(`Delete ${piece.accessionNumber}? An admin can restore it.`) &&
                remove.mutate(undefined, { onSuccess: () => navigate(paths.archive()) })
              }
            >
              Delete
            </Button>
          ) : null}
          {can['piece:restore'] && deleted ? <Button onClick={() => restore.mutate()}>Restore</Button> : null}
        </>
      }
    >
      {error ? (
        <p role="alert" className="mb-4 rounded-md bg-danger-tint px-3 py-2 text-sm text-danger">
          {error.message}
        </p>
      ) : null}
      {/* minmax(0, 1fr): a wide table (display periods, findings) scrolls in its own box instead of widening the page. */}
      <div className="grid grid-cols-[minmax(0,1fr)] gap-8">
        <PieceFacts piece={piece} />
        {!deleted ? (
          <PieceShareLinks pieceId={id} published={piece.status === 'published'} hasPhotos={photos.length > 0} />
        ) : null}
        <section className="space-y-4">
          <h2 className="font-serif text-2xl">Photos and palettes</h2>
          {can['photo:create'] && !deleted ? <UploadPanel pieceId={id} /> : null}
          {photos.length === 0 ? <p className="text-sm text-ink-soft">No photos yet.</p> : null}
          {photos.map((p) => (
            <PhotoPanel key={p.id} photo={p} />
          ))}
        </section>
        {allowed('trial:read') ? <PieceReadings pieceId={id} canEdit={!deleted} /> : null}
        {/* Everyone signed in sees the pairs: dyers aim trials at them. */}
        {allowed('trial:read') ? <FadingPairs pieceId={id} canEdit={can['piece:update'] && !deleted} /> : null}
        <AnalysesPanel
          pieceId={id}
          terms={[...piece.dyestuffs, ...piece.historicalMordants]}
          regions={photos.flatMap((p, i) =>
            p.regions.map((r) => ({ id: r.id, label: `photo ${i + 1}: ${r.label ?? r.purpose.replace('-', ' ')}` })),
          )}
        />
        {signedIn ? (
          <ConditionPanel
            pieceId={id}
            photos={photos.map((p, i) => ({ id: p.id, label: p.caption ?? `photo ${i + 1}` }))}
          />
        ) : null}
        {signedIn ? <LightPanel pieceId={id} /> : null}
        {can['piece:history'] ? (
          <section>
            <h2 className="font-serif text-2xl">Edit history</h2>
            {showHistory ? (
              <PieceHistory pieceId={id} />
            ) : (
              <Button variant="quiet" onClick={() => setShowHistory(true)}>
                Show who changed what
              </Button>
            )}
          </section>
        ) : null}
      </div>
    </Page>
  );
}
