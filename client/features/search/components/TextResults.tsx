import { Link } from 'react-router-dom';
import type { SearchHighlight, SearchItem } from '../../../../shared/schemas/search';
import { paths } from '../../../paths';

const FIELD_NAMES: Record<string, string> = {
  accessionNumber: 'Accession number',
  title: 'Title',
  objectName: 'Object',
  description: 'Description',
  provenance: 'Provenance',
  place: 'Place',
  techniques: 'Techniques',
  dyestuffs: 'Dyestuffs',
  historicalMordants: 'Historical mordants',
  modernMordants: 'Modern mordants',
};

function Marked({ h }: { h: SearchHighlight }) {
  const parts: Array<{ text: string; mark: boolean }> = [];
  let at = 0;
  for (const [s, e] of h.marks) {
    if (s < at) continue;
    parts.push({ text: h.text.slice(at, s), mark: false }, { text: h.text.slice(s, e), mark: true });
    at = e;
  }
  parts.push({ text: h.text.slice(at), mark: false });
  return (
    <>
      {parts.map((p, i) =>
        p.mark ? (
          <mark key={i} className="bg-warn-tint text-ink rounded-sm">
            {p.text}
          </mark>
        ) : (
          <span key={i}>{p.text}</span>
        ),
      )}
    </>
  );
}

/** Text matches: the piece, a thumbnail, and where the words were found. */
export function TextResults({ items }: { items: SearchItem[] }) {
  return (
    <ol className="space-y-3" aria-label="Pieces found">
      {items.map((i) => (
        <li key={i.id} className="flex gap-3 rounded-lg border border-rule bg-sheet p-3">
          <div className="h-16 w-16 shrink-0 rounded bg-neutral-ground overflow-hidden">
            {i.photoId ? (
              <img
                src={`/media/photos/${i.photoId}/thumb`}
                alt=""
                loading="lazy"
                className="h-full w-full object-cover"
              />
            ) : null}
          </div>
          <div className="min-w-0">
            <Link to={paths.piece(i.id)} className="text-action hover:underline font-medium">
              <span className="font-mono">{i.accessionNumber}</span> {i.title}
            </Link>
            <div className="text-xs text-ink-soft">
              {[i.objectName, i.dateText, i.place, i.dyestuffs.join(', ')].filter(Boolean).join(' · ')}
              {i.status === 'draft' ? <span className="ml-2 rounded bg-warn-tint px-1 text-warn">draft</span> : null}
            </div>
            {i.highlights.slice(0, 3).map((h) => (
              <p key={h.field} className="text-sm mt-1">
                <span className="text-ink-faint">{FIELD_NAMES[h.field] ?? h.field}: </span>
                <Marked h={h} />
              </p>
            ))}
            {i.viaTrials.length ? (
              <p className="text-xs text-ink-soft mt-1">Found in trial {i.viaTrials.join(', ')}</p>
            ) : null}
          </div>
        </li>
      ))}
    </ol>
  );
}
