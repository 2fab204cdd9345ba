import { Link, useNavigate, useParams } from 'react-router-dom';
import { Page } from '../components/Page';
import { useCan } from '../features/auth/api';
import { useCreatePiece, usePiece, useUpdatePiece } from '../features/pieces/api';
import { PieceForm } from '../features/pieces/components/PieceForm';
import { paths } from '../paths';

export function PieceNewPage() {
  const can = useCan();
  const create = useCreatePiece();
  const navigate = useNavigate();
  if (!can('piece:create'))
    return (
      <Page title="Catalogue a piece" lead="Only curators and admins catalogue pieces. Sign in with such an account." />
    );
  return (
    <Page title="Catalogue a piece" lead="Saved as a draft; publish it from the record when it is ready for visitors.">
      <PieceForm
        submitLabel="Save draft"
        onSubmit={async (input) => navigate(paths.piece((await create.mutateAsync(input)).piece.id))}
      />
    </Page>
  );
}

export function PieceEditPage() {
  const id = Number(useParams().id);
  const detail = usePiece(id);
  const update = useUpdatePiece(id);
  const navigate = useNavigate();
  if (detail.isPending) return <p>Loading…</p>;
  if (detail.isError) return <Page title="Piece not found" lead={detail.error.message} />;
  const { piece } = detail.data;
  if (!piece.abilities['piece:update']) return <Page title={piece.title} lead="Your role may not edit this record." />;
  return (
    <Page
      title={`Edit ${piece.accessionNumber}`}
      actions={
        <Link to={paths.piece(id)} className="text-sm text-action hover:underline">
          Back to the record
        </Link>
      }
    >
      <PieceForm
        piece={piece}
        submitLabel="Save changes"
        onSubmit={async (input) => {
          await update.mutateAsync(input);
          navigate(paths.piece(id));
        }}
      />
    </Page>
  );
}
