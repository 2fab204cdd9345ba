import { formatNumber } from '../../../../shared/format';
import { IMAGE_ESTIMATE, ViewingConditions } from '../../../components/ViewingConditions';
import { ShadeSearchLink } from '../../search';
import { SuggestRecipeLink } from '../../suggestions';
import type { Palettes } from '../api';

type Colour = Palettes[number]['colours'][number];
const pct = (x: number) => `${(x * 100).toFixed(1)} %`;
const fix = (x: number) => formatNumber(x);

/**
 * One palette: a bar whose segments are proportional to share, then swatches large
 * enough to judge, all on neutral grey so no tinted surround biases the eye. Text on the grey sits on a white
 * chip (white text on it is 3.9:1); background colours are dimmed to 80 %, where links and grey text keep 4.5:1 (WCAG 2.1 AA).
 */
export function PaletteBar({
  title,
  colours,
  onToggleBackground,
  pieceId = null,
}: {
  title: string;
  colours: Colour[];
  onToggleBackground?: (c: Colour) => void;
  /** The piece the photo belongs to: its colours get "Suggest a recipe" (a trial's swatch photo has none). */
  pieceId?: number | null;
}) {
  const counted = colours.filter((c) => !c.background);
  return (
    <figure className="rounded-lg bg-neutral-ground p-3" aria-label={title}>
      <figcaption className="mb-2 flex flex-wrap justify-between gap-2 text-sm">
        <span className="rounded bg-sheet/90 px-1.5 py-0.5 font-medium text-ink">{title}</span>
        <span className="rounded bg-sheet/90 px-1.5 py-0.5 text-xs text-ink-soft">
          CIELAB, <ViewingConditions colour={IMAGE_ESTIMATE} />
        </span>
      </figcaption>
      <div
        className="flex h-10 w-full overflow-hidden rounded"
        role="img"
        aria-label={counted.map((c) => `${c.name} ${pct(c.share)}`).join(', ')}
      >
        {counted.map((c) => (
          <div
            key={c.id}
            style={{ width: `${c.share * 100}%`, background: c.hex }}
            title={`${c.name} · ${c.hex} · ${pct(c.share)}`}
          />
        ))}
      </div>
      <ul className="mt-3 grid gap-2 grid-cols-1 sm:grid-cols-2 lg:grid-cols-4">
        {colours.map((c) => (
          <li
            key={c.id}
            className={`flex gap-3 rounded bg-neutral-light p-2 ${c.background ? 'opacity-80' : ''}`}
            data-testid="palette-colour"
          >
            <div
              className="h-16 w-16 shrink-0 rounded border border-rule-strong"
              style={{ background: c.hex }}
              aria-hidden="true"
            />
            <div className="min-w-0 text-xs leading-5">
              <div className="font-medium text-sm truncate">{c.tradeName ?? c.name}</div>
              {c.tradeName ? <div className="text-ink-soft truncate">{c.name}</div> : null}
              <div className="font-mono">{c.hex}</div>
              <div className="font-mono">
                L* {fix(c.lab.L)} a* {fix(c.lab.a)} b* {fix(c.lab.b)}
              </div>
              <div className="num">{c.background ? 'background, not counted' : `share ${pct(c.share)}`}</div>
              <div>
                <ShadeSearchLink hex={c.hex} className="text-action hover:underline">
                  Pieces with this shade
                </ShadeSearchLink>
              </div>
              {pieceId != null && !c.background ? (
                <div>
                  <SuggestRecipeLink pieceId={pieceId} paletteColourId={c.id} />
                </div>
              ) : null}
              {onToggleBackground ? (
                <button
                  type="button"
                  className="text-action hover:underline"
                  onClick={() => onToggleBackground(c)}
                  aria-pressed={c.background}
                >
                  {c.background ? 'Count this colour' : 'Mark as background'}
                </button>
              ) : null}
            </div>
          </li>
        ))}
      </ul>
    </figure>
  );
}
