import type { TrialSummaryView } from '../api';
import { labToHex } from '../../../../shared/colour';
import { fmt, lab as labText } from '../format';
import { ShadeSearchLink } from '../../search/components/ShadeSearchLink';
import { VerdictBadge } from './VerdictBadge';

type Colour = NonNullable<TrialSummaryView['colour']>;
const sourceWords = { instrument: 'instrument measurement', 'image-estimate': 'image estimate' } as const;

/** Original and result side by side on the neutral grey ground, with ΔE00, CMC, words and which colours were used. */
export function ColourComparison({ colour, large = false }: { colour: Colour; large?: boolean }) {
  const d = colour.difference;
  const src = (c: Colour['target']) => (c ? `${sourceWords[c.source]}: ${c.label}${c.setAside ? ' (an image estimate of the same place was set aside: measured colour outranks it)' : ''}` : undefined);
  const block = (c: Colour['target'], label: string) =>
    c ? <div className="flex-1" role="img" aria-label={`${label}: ${labText(c)}`} style={{ background: labToHex(c) }} /> : <div className="flex flex-1 items-center justify-center bg-neutral-light text-sm text-ink-soft">{label}: no colour yet</div>;
  const caption = (c: Colour['target'], label: string) => (
    <div className="text-xs">
      <p className="font-medium text-ink">{label}</p>
      {c ? <p className="font-mono text-ink-soft">{labText(c)}</p> : null}
      {c ? <p className="text-ink-soft">{src(c)}</p> : null}
      {c ? <ShadeSearchLink hex={labToHex(c)} className="text-action hover:underline" /> : null}
    </div>
  );
  return (
    <div className="grid gap-4 md:grid-cols-[1fr_minmax(12rem,16rem)]">
      <div>
        {/* Both colours touch on one neutral grey ground: the fairest way to judge them by eye. */}
        <div className={`flex rounded-lg bg-neutral-ground p-6 ${large ? 'h-64' : 'h-40'}`}>
          {block(colour.target, 'Original (target)')}
          {block(colour.result, 'Reproduction (result)')}
        </div>
        <div className="mt-2 grid grid-cols-2 gap-4">
          {caption(colour.target, 'Original (target)')}
          {caption(colour.result, 'Reproduction (result)')}
        </div>
      </div>
      <div className="rounded-lg border border-rule bg-sheet p-3 text-sm">
        {d ? (
          <>
            <p className="text-2xl font-mono" aria-label="Delta E 2000">ΔE00 {fmt(d.deltaE00, 2)}</p>
            <p className="mt-1"><VerdictBadge verdict={d.verdict} /></p>
            <p className="mt-2">{d.words.length ? <>The reproduction is <strong>{d.words.join(', ')}</strong> than the original.</> : 'No difference worth putting into words.'}</p>
            <dl className="mt-2 grid grid-cols-2 gap-x-2 font-mono text-xs">
              <dt>CMC(2:1)</dt><dd className="text-right">{fmt(d.cmc21, 2)}</dd>
              <dt>CMC(1:1)</dt><dd className="text-right">{fmt(d.cmc11, 2)}</dd>
              <dt>ΔL*</dt><dd className="text-right">{fmt(d.dL, 2)}</dd>
              <dt>ΔC*</dt><dd className="text-right">{fmt(d.dC, 2)}</dd>
            </dl>
            <p className="mt-2 text-xs text-ink-faint">CIEDE2000 (1:1:1); the original is the standard for CMC. Verdict bands: {colour.bandsSource}.</p>
          </>
        ) : (
          <p className="text-ink-soft">{!colour.target ? 'Choose a target colour of the original to compare with.' : 'Record a measurement or a swatch photo of the result to compare.'}</p>
        )}
      </div>
    </div>
  );
}
