import type { ReactNode } from 'react';
import { rightsLabel } from '../../../../shared/rights';
import type { Piece } from '../api';

const rights = (uri: string | null) =>
  uri ? (
    <a href={uri} className="text-action hover:underline" rel="license noreferrer" target="_blank">
      {rightsLabel(uri)}
    </a>
  ) : null;

/** Rows for PieceFacts: makers, pattern, marks, storage (present only for the team) and rights. */
export function curatorialFacts(piece: Piece): [string, ReactNode][] {
  return [
    ['Pattern name', piece.patternName],
    [
      'Makers',
      piece.makers.length
        ? piece.makers.map((m) => `${m.name} (${m.role}${m.dates ? `, ${m.dates}` : ''})`).join('; ')
        : null,
    ],
    [
      'Marks and inscriptions',
      piece.marks.length
        ? piece.marks.map((m) => `${m.kind}: “${m.text}”${m.place ? ` (${m.place})` : ''}`).join('\n')
        : null,
    ],
    ['Storage location', piece.storageLocation ?? null],
    ['Object rights', rights(piece.objectRights)],
    ['Image rights', rights(piece.imageRights)],
  ];
}
