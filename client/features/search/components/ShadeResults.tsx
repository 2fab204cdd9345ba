import { formatNumber } from '../../../../shared/format';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { ShadeItem } from '../../../../shared/schemas/search';
import { paths } from '../../../paths';
import { IMAGE_ESTIMATE, ViewingConditions } from '../../../components/ViewingConditions';

const thumb = (photoId: number) => `/media/photos/${photoId}/thumb`;
const pct = (share: number) => `${(share * 100).toFixed(0)} %`;

/** Shade matches as a ranked table or a grid of swatches with thumbnails. */
export function ShadeResults({ items }: { items: ShadeItem[] }) {
  const [view, setView] = useState<'table' | 'grid'>('table');
  return (
    <div>
      <div
        role="group"
        aria-label="Show results as"
        className="mb-3 inline-flex rounded-md border border-rule-strong text-sm"
      >
        {(['table', 'grid'] as const).map((v) => (
          <button
            key={v}
            type="button"
            aria-pressed={view === v}
            onClick={() => setView(v)}
            className={`px-3 py-1.5 ${view === v ? 'bg-neutral-light font-medium' : ''}`}
          >
            {v === 'table' ? 'Table' : 'Swatches'}
          </button>
        ))}
      </div>
      {/* Every match is a photo palette colour, so all the figures share one set of conditions. */}
      <p className="mb-2 text-xs text-ink-soft">
        Colours of the matches: CIELAB, <ViewingConditions colour={IMAGE_ESTIMATE} />
      </p>
      {view === 'table' ? (
        // Eight columns of figures do not fit a phone: the table scrolls inside its own box, never the page.
        <div className="relative overflow-x-auto">
          <table className="w-full text-sm" aria-label="Shade matches">
            <thead className="text-left text-ink-soft border-b border-rule">
              <tr>
                <th className="py-2 pr-2">Rank</th>
                <th className="py-2 pr-2">Colour</th>
                <th className="py-2 pr-2">Piece</th>
                <th className="py-2 pr-2 text-right">L*</th>
                <th className="py-2 pr-2 text-right">a*</th>
                <th className="py-2 pr-2 text-right">b*</th>
                <th className="py-2 pr-2 text-right">Share</th>
                <th className="py-2 text-right">ΔE00</th>
              </tr>
            </thead>
            <tbody>
              {items.map((i, k) => (
                <tr key={`${i.pieceId}-${i.photoId}`} className="border-b border-rule">
                  <td className="py-1.5 pr-2 num">{k + 1}</td>
                  <td className="py-1.5 pr-2">
                    <span className="inline-flex items-center gap-2 rounded bg-neutral-ground p-1">
                      <span className="block h-5 w-8 rounded-sm" style={{ background: i.colour.hex }} />
                    </span>
                    <span className="ml-2 font-mono text-xs">{i.colour.hex}</span>
                  </td>
                  <td className="py-1.5 pr-2">
                    <Link to={paths.piece(i.pieceId)} className="text-action hover:underline">
                      <span className="font-mono">{i.accessionNumber}</span> {i.title}
                    </Link>
                  </td>
                  <td className="py-1.5 pr-2 text-right num">{formatNumber(i.colour.lab.L)}</td>
                  <td className="py-1.5 pr-2 text-right num">{formatNumber(i.colour.lab.a)}</td>
                  <td className="py-1.5 pr-2 text-right num">{formatNumber(i.colour.lab.b)}</td>
                  <td className="py-1.5 pr-2 text-right num">{pct(i.colour.share)}</td>
                  <td className="py-1.5 text-right num">{i.deltaE00.toFixed(2)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : (
        <ul className="grid grid-cols-2 sm:grid-cols-3 lg:grid-cols-4 gap-3" aria-label="Shade matches">
          {items.map((i) => (
            <li key={`${i.pieceId}-${i.photoId}`} className="rounded-lg border border-rule bg-sheet overflow-hidden">
              <Link to={paths.piece(i.pieceId)} className="block">
                <div className="bg-neutral-ground p-2 flex gap-2">
                  <img
                    src={thumb(i.photoId)}
                    alt={`Photo of ${i.accessionNumber}`}
                    loading="lazy"
                    className="h-20 w-20 object-cover bg-neutral-light"
                  />
                  <span className="flex-1 rounded-sm" style={{ background: i.colour.hex }} aria-hidden="true" />
                </div>
                <div className="p-2 text-xs">
                  <div className="font-mono">{i.accessionNumber}</div>
                  <div className="truncate">{i.title}</div>
                  <div className="num text-ink-soft">
                    ΔE00 {i.deltaE00.toFixed(2)} · {pct(i.colour.share)} of photo
                  </div>
                </div>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
