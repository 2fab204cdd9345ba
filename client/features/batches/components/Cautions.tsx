import type { BatchDetail } from '../api';

/** Signal word, H statements and PPE for every chemical in the batch; the SDS has the last word. */
export function Cautions({ items }: { items: BatchDetail['cautions'] }) {
  const hazardous = items.filter((c) => c.signalWord || c.hStatements.length);
  if (!hazardous.length) return <p className="text-sm text-ink-soft">No GHS signal word for these chemicals; still read the supplier’s safety data sheet.</p>;
  return (
    <ul className="space-y-2">
      {hazardous.map((c) => (
        <li key={c.id} className={`rounded-md px-3 py-2 text-sm ${c.signalWord === 'Danger' ? 'bg-danger-tint' : 'bg-warn-tint'}`}>
          <p>
            <strong className={c.signalWord === 'Danger' ? 'text-danger' : 'text-warn'}>{c.signalWord ?? 'Caution'}</strong> — {c.name}
          </p>
          <p className="text-ink-soft">{c.hStatements.join(' ')}</p>
          {c.ppe ? <p className="text-ink-soft">PPE: {c.ppe}</p> : null}
          <p className="text-xs text-ink-faint">Follow the supplier’s safety data sheet and local rules.</p>
        </li>
      ))}
    </ul>
  );
}
