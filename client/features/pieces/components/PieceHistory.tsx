import { formatDateTime } from '../../../../shared/format';
import { describeHistory } from '../../../../shared/history-words';
import { useHistory } from '../api';

/** Who changed what and when, newest first, from the audit log. */
export function PieceHistory({ pieceId }: { pieceId: number }) {
  const history = useHistory(pieceId, true);
  if (history.isPending) return <p className="text-sm">Loading the history…</p>;
  if (history.isError) return <p className="text-sm text-danger">{history.error.message}</p>;
  return (
    <ol className="space-y-2 text-sm" data-testid="history">
      {history.data.items.map((e) => (
        <li key={e.id} className="border-l-2 border-rule pl-3">
          <time className="num text-ink-soft" dateTime={e.at}>
            {formatDateTime(e.at)}
          </time>{' '}
          · {e.actor?.name ?? 'The system'}: {describeHistory(e)}
        </li>
      ))}
    </ol>
  );
}
