import type { TrialSummaryView } from '../api';
import { labToHex } from '../../../../shared/colour';
import { conditionsText, signed } from '../../../../shared/colour/conditions';
import { ViewingConditions } from '../../../components/ViewingConditions';
import { fmt, lab as labText } from '../format';
import { ShadeSearchLink } from '../../search';
import { VerdictBadge } from './VerdictBadge';

type Colour = NonNullable<TrialSummaryView['colour']>;
type Difference = NonNullable<Colour['difference']>;

/** ΔE00, CMC and the signed CIELAB components (CIE 15), sample minus original. */
function Figures({ d }: { d: Difference }) {
  const row = (term: string, value: string, title?: string) => (
    <>
      <dt title={title}>{term}</dt>
      <dd className="text-right">{value}</dd>
    </>
  );
  return (
    <dl className="mt-2 grid grid-cols-2 gap-x-2 font-mono text-xs" aria-label="Colour difference figures">
      {row('CMC(2:1)', fmt(d.cmc21, 2))}
      {row('CMC(1:1)', fmt(d.cmc11, 2))}
      {row('ΔL*', signed(d.dL), 'lightness difference')}
      {row('ΔC*ab', signed(d.dC), 'chroma difference')}
      {row('ΔH*ab', signed(d.dH), 'hue difference, signed by the direction of the hue-angle change')}
      {row('ΔE*ab', fmt(d.deltaEab, 2), 'CIE 1976 colour difference')}
    </dl>
  );
}

/** Original and result side by side on the neutral grey ground, with ΔE00, CMC, the signed ΔL*, ΔC*ab and ΔH*ab, words and the viewing conditions. */
export function ColourComparison({ colour, large = false }: { colour: Colour; large?: boolean }) {
  const d = colour.difference;
  const block = (c: Colour['target'], label: string, none: string) =>
    c ? (
      <div
        className="flex-1"
        role="img"
        aria-label={`${label}: ${labText(c)}, ${conditionsText(c)}`}
        style={{ background: labToHex(c) }}
      />
    ) : (
      <div className="flex flex-1 items-center justify-center bg-neutral-light p-2 text-center text-sm text-ink-soft">
        {label}: {none}
      </div>
    );
  const caption = (c: Colour['target'], label: string) => (
    <div className="text-xs">
      <p className="font-medium text-ink">{label}</p>
      {c ? (
        <>
          <p className="font-mono text-ink-soft">{labText(c)}</p>
          <p>
            <ViewingConditions colour={c} />
          </p>
          <p className="text-ink-soft">{c.label}</p>
          {c.setAside ? (
            <p className="text-ink-faint">
              An image estimate of the same place ({conditionsText(c.setAside)}) was set aside: a measured colour
              outranks it.
            </p>
          ) : null}
          <ShadeSearchLink hex={labToHex(c)} className="text-action hover:underline" />
        </>
      ) : null}
    </div>
  );
  const noResult = colour.missing ? `no reading under ${colour.missing.illuminant}` : 'no colour yet';
  const others = colour.comparisons.filter((c) => !c.primary);
  return (
    <div className="space-y-3">
      <div className="grid gap-4 md:grid-cols-[1fr_minmax(12rem,16rem)]">
        <div>
          {/* Both colours touch on one neutral grey ground: the fairest way to judge them by eye. */}
          <div className={`flex rounded-lg bg-neutral-ground p-6 ${large ? 'h-64' : 'h-40'}`}>
            {block(colour.target, 'Original (target)', 'no colour yet')}
            {block(colour.result, 'Reproduction (result)', noResult)}
          </div>
          <div className="mt-2 grid grid-cols-2 gap-4">
            {caption(colour.target, 'Original (target)')}
            {caption(colour.result, 'Reproduction (result)')}
          </div>
        </div>
        <div className="rounded-lg border border-rule bg-sheet p-3 text-sm">
          {d && colour.conditions ? (
            <>
              <p className="text-2xl font-mono" aria-label="Delta E 2000">
                ΔE00 {fmt(d.deltaE00, 2)}
              </p>
              <p className="mt-1">
                <VerdictBadge verdict={d.verdict} />
              </p>
              <p className="mt-1 text-xs text-ink-soft" data-testid="comparison-conditions">
                Under {colour.conditions.illuminant}; original {colour.conditions.targetObserver}°, reproduction{' '}
                {colour.conditions.resultObserver}° observer
              </p>
              <p className="mt-2">
                {d.words.length ? (
                  <>
                    The reproduction is <strong>{d.words.join(', ')}</strong> than the original.
                  </>
                ) : (
                  'No difference worth putting into words.'
                )}
              </p>
              <Figures d={d} />
              {colour.note ? (
                <p role="note" className="mt-2 rounded bg-warn-tint p-2 text-xs text-warn">
                  {colour.note}
                </p>
              ) : null}
              <p className="mt-2 text-xs text-ink-faint">
                CIEDE2000 (1:1:1); ΔL*, ΔC*ab, ΔH*ab (CIE 15) are the reproduction minus the original, which is the
                standard for CMC. Verdict bands: {colour.bandsSource}.
              </p>
            </>
          ) : colour.missing ? (
            <p role="status" className="text-ink-soft" data-testid="missing-reading">
              No ΔE is given under {colour.missing.illuminant}. {colour.missing.message}
            </p>
          ) : (
            <p className="text-ink-soft">
              {!colour.target
                ? 'Choose a target colour of the original to compare with.'
                : 'Record a measurement or a swatch photo of the result to compare.'}
            </p>
          )}
        </div>
      </div>
      {others.length ? (
        <div className="overflow-x-auto">
          <table className="w-full max-w-3xl text-xs" aria-label="The same comparison under other illuminants">
            <caption className="mb-1 text-left text-sm font-medium text-ink">
              Under other illuminants both sides were read under
            </caption>
            <thead className="text-left text-ink-soft">
              <tr>
                <th className="pr-3">Illuminant</th>
                <th className="pr-3">Original</th>
                <th className="pr-3">Reproduction</th>
                <th className="pr-3 text-right">ΔE00</th>
                <th className="pr-3 text-right">ΔL*</th>
                <th className="pr-3 text-right">ΔC*ab</th>
                <th className="text-right">ΔH*ab</th>
              </tr>
            </thead>
            <tbody className="font-mono">
              {others.map((c) => (
                <tr key={c.illuminant} className="border-t border-rule">
                  <td className="pr-3">{c.illuminant}</td>
                  <td className="pr-3 font-sans">
                    <ViewingConditions colour={c.target} />
                  </td>
                  <td className="pr-3 font-sans">
                    <ViewingConditions colour={c.result} />
                    {c.observersDiffer ? <span className="block text-warn">observers differ</span> : null}
                  </td>
                  <td className="pr-3 text-right">{fmt(c.difference.deltaE00, 2)}</td>
                  <td className="pr-3 text-right">{signed(c.difference.dL)}</td>
                  <td className="pr-3 text-right">{signed(c.difference.dC)}</td>
                  <td className="text-right">{signed(c.difference.dH)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
      {colour.results.length > 1 ? (
        <div className="text-xs">
          <p className="font-medium text-ink">The reproduction's colours, each under its own conditions</p>
          <p className="text-ink-faint">
            Readings are averaged only when taken under the same illuminant and observer.
          </p>
          <ul className="mt-1 space-y-0.5">
            {colour.results.map((r) => (
              <li key={`${r.source}-${r.illuminant}-${r.observer}`} className="flex flex-wrap items-center gap-x-2">
                <span
                  className="inline-block h-3 w-5 rounded-sm border border-rule-strong"
                  style={{ background: labToHex(r) }}
                  aria-hidden="true"
                />
                <ViewingConditions colour={r} />
                <span className="font-mono text-ink-soft">{labText(r)}</span>
                <span className="text-ink-faint">
                  {r.readings ? `${r.readings} reading${r.readings === 1 ? '' : 's'}` : r.label}
                </span>
              </li>
            ))}
          </ul>
        </div>
      ) : null}
    </div>
  );
}
