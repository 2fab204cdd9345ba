import type { ReactNode } from 'react';
import type { Piece } from '../api';
import { yearsOf } from './ArchiveTable';
import { curatorialFacts } from './curatorialFacts';

/** "madder (identified)" links to the analysis behind it, further down the page. */
function Evidenced({ list }: { list: Piece['dyestuffs'] }) {
  return (
    <>
      {list.map((d, i) => (
        <span key={d.name}>
          {i ? '; ' : ''}
          {d.evidence === 'identified' && d.analysisId ? (
            <a className="text-action hover:underline" href={`#analysis-${d.analysisId}`}>
              {d.name} (identified)
            </a>
          ) : (
            `${d.name} (${d.evidence})`
          )}
        </span>
      ))}
    </>
  );
}

const mm = (v: number | null) => (v == null ? null : `${v} mm`);

/** The catalogue fields of a piece as a definition list; empty fields are left out. */
export function PieceFacts({ piece }: { piece: Piece }) {
  const rows: [string, ReactNode][] = [
    ['Accession number', <span className="font-mono">{piece.accessionNumber}</span>],
    ['Object', piece.objectName],
    ['Date', <span className="num">{yearsOf(piece)}</span>],
    ['Date (EDTF)', piece.dateEdtf ? <span className="font-mono">{piece.dateEdtf}</span> : null],
    ['Place', piece.place],
    ['Fibres', piece.fibres.join(', ') || null],
    ['Weave', piece.weave],
    ['Thread count', piece.threadCount],
    [
      'Height × width',
      piece.heightMm != null || piece.widthMm != null ? (
        <span className="num">{`${mm(piece.heightMm) ?? '—'} × ${mm(piece.widthMm) ?? '—'}`}</span>
      ) : null,
    ],
    ['Pattern repeat', piece.repeatMm != null ? <span className="num">{mm(piece.repeatMm)}</span> : null],
    ['Techniques', piece.techniques.join(', ') || null],
    ['Dyestuffs', piece.dyestuffs.length ? <Evidenced list={piece.dyestuffs} /> : null],
    ['Historical mordants', piece.historicalMordants.length ? <Evidenced list={piece.historicalMordants} /> : null],
    ['Description', piece.description],
    ['Provenance', piece.provenance],
    ['Condition', piece.condition],
    ['Credit line', piece.creditLine],
    ...curatorialFacts(piece),
  ];
  return (
    <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-[12rem_1fr] text-sm">
      {rows
        .filter(([, v]) => v != null && v !== '')
        .map(([k, v]) => (
          <div key={k} className="contents">
            <dt className="font-medium text-ink-soft">{k}</dt>
            <dd className="whitespace-pre-line">{v}</dd>
          </div>
        ))}
    </dl>
  );
}
