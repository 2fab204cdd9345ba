import { Link } from 'react-router-dom';
import { paths } from '../../../paths';
import { useCan } from '../../auth';

/** The piece page's way into its trials: attach one (dyers) and compare them all (everyone signed in). */
export function PieceTrialLinks({ pieceId }: { pieceId: number }) {
  const can = useCan();
  return (
    <>
      {can('trial:read') ? (
        <Link
          className="rounded-md border border-rule-strong bg-sheet px-4 py-2 text-sm font-medium hover:bg-paper"
          to={paths.sideBySide(pieceId)}
        >
          Trials side by side
        </Link>
      ) : null}
      {can('trial:create') ? (
        <Link
          className="rounded-md bg-action px-4 py-2 text-sm font-medium text-white hover:bg-action-strong"
          to={paths.trialNew(pieceId)}
        >
          Attach a trial
        </Link>
      ) : null}
    </>
  );
}
