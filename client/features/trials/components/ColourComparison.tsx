import type { TrialSummaryView } from '../api';
import { fmt } from '../format';
import { Swatch } from './Swatch';
import { VerdictBadge } from './VerdictBadge';

type Colour = NonNullable<TrialSummaryView['colour']>;
const sourceWords = { instrument: 'instrument measurement', 'image-estimate': 'image estimate' } as const;

/** Original and result side by side on the neutral grey ground, with ΔE00, CMC, words and which colours were used. */
export function ColourComparison({ colour, large = false }: { colour: Colour; large?: boolean }) {
  const d = colour.difference;
  const src = (c: Colour['target']) => (c ? `${sourceWords[c.source]}: ${c.label}${c.setAside ? ' (an image estimate of the same place was set aside: measured colour outranks it)' : ''}` : undefined);
  return (
    <div className="grid gap-4 md:grid-cols-[1fr_1fr_minmax(12rem,16rem)]">
      <div className="rounded-lg bg-neutral-ground p-3"><Swatch size={large ? 'lg' : 'md'} label="Original (target)" colour={colour.target} caption={src(colour.target)} /></div>
      <div className="rounded-lg bg-neutral-ground p-3"><Swatch size={large ? 'lg' : 'md'} label="Reproduction (result)" colour={colour.result} caption={src(colour.result)} /></div>
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
