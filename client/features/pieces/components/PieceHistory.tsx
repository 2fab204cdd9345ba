import { useHistory } from '../api';

const ACTIONS: Record<string, string> = {
  create: 'catalogued',
  update: 'edited',
  publish: 'published',
  unpublish: 'returned to draft',
  delete: 'deleted',
  restore: 'restored',
  'photo-added': 'added a photo',
  'photo-updated': 'changed a photo',
  'photo-removed': 'removed a photo',
  'region-added': 'drew a region',
  'region-changed': 'changed a region',
  'region-removed': 'removed a region',
  'reference-patch-set': 'marked a reference patch',
  'reference-patch-cleared': 'removed the reference patch',
  'palette-background': 'changed a background colour',
};

/** Who changed what and when, newest first, from the audit log. */
export function PieceHistory({ pieceId }: { pieceId: number }) {
  const history = useHistory(pieceId, true);
  if (history.isPending) return <p className="text-sm">Loading the history…</p>;
  if (history.isError) return <p className="text-sm text-danger">{history.error.message}</p>;
  return (
    <ol className="space-y-2 text-sm" data-testid="history">
      {history.data.items.map((e) => (
        <li key={e.id} className="border-l-2 border-rule pl-3">
          <span className="num text-ink-soft">{new Date(e.at).toLocaleString()}</span> · {e.actor?.name ?? 'system'} {ACTIONS[e.action] ?? e.action}
          {e.fields.length && e.action !== 'create' ? <span className="text-ink-soft"> — {e.fields.filter((f) => f !== 'photoId').join(', ')}</span> : null}
        </li>
      ))}
    </ol>
  );
}
