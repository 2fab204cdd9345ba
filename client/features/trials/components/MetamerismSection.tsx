import type { TrialSummaryView } from '../api';
import { ILLUMINANT_WORDS } from '../../../../shared/colour/spectral-words';
import { fmt } from '../format';
import { SpectrumChart } from './SpectrumChart';

type Metamerism = NonNullable<NonNullable<TrialSummaryView['colour']>['metamerism']>;

/**
 * The original's and the reproduction's spectra, and how the pair looks under each light: ΔE00
 * as seen, the worst light, and the metamerism index (CIE 015, the daylight difference taken out).
 */
export function MetamerismSection({ m }: { m: Metamerism }) {
  return (
    <section aria-labelledby="metamerism-h" className="space-y-3">
      <h3 id="metamerism-h" className="font-semibold">
        Under other lights
      </h3>
      <p className="text-sm" data-testid="metamerism-summary">
        The reproduction <strong>{m.summary}</strong>.
      </p>
      <SpectrumChart
        title="Reflectance spectra of the original and the reproduction"
        series={[
          { label: `Original: ${m.reference.label}`, spectrum: m.reference.spectrum },
          { label: `Reproduction: ${m.sample.label}`, spectrum: m.sample.spectrum },
        ]}
      />
      <div className="max-w-2xl overflow-x-auto">
        <table className="w-full rounded-lg border border-rule bg-sheet text-sm" aria-describedby="metamerism-note">
          <caption className="mb-1 text-left text-sm text-ink-soft">
            The pair under each illuminant ({m.observer}° observer): ΔE00 as seen, the index with the daylight
            difference taken out, and how the reproduction looks. Worst: {ILLUMINANT_WORDS[m.worst.illuminant]}
          </caption>
          <thead className="bg-paper text-left text-ink-soft">
            <tr>
              <th scope="col" className="px-2 py-1.5 sm:px-3">
                Illuminant
              </th>
              <th scope="col" className="px-2 py-1.5 sm:px-3 text-right">
                ΔE00
              </th>
              <th scope="col" className="px-2 py-1.5 sm:px-3 text-right">
                Index
              </th>
              <th scope="col" className="px-2 py-1.5 sm:px-3">
                Looks
              </th>
            </tr>
          </thead>
          <tbody>
            {m.byIlluminant.map((r) => {
              const worst = r.illuminant === m.worst.illuminant;
              return (
                <tr key={r.illuminant} className={`border-t border-rule ${worst ? 'bg-warn-tint' : ''}`}>
                  <th scope="row" className="px-2 py-1.5 sm:px-3 text-left font-normal">
                    {ILLUMINANT_WORDS[r.illuminant]}
                    {worst ? <strong className="ml-1 text-warn">worst</strong> : null}
                  </th>
                  <td className="px-2 py-1.5 sm:px-3 text-right font-mono">{fmt(r.deltaE00, 2)}</td>
                  <td className="px-2 py-1.5 sm:px-3 text-right font-mono">
                    {r.illuminant === m.referenceIlluminant ? 'reference' : fmt(r.corrected, 2)}
                  </td>
                  <td className="px-2 py-1.5 sm:px-3">{r.words.length ? r.words.join(', ') : '—'}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p id="metamerism-note" className="text-xs text-ink-faint">
        Metamerism index{' '}
        {m.index != null && m.indexIlluminant
          ? `${fmt(m.index, 2)} (ΔE00, under ${ILLUMINANT_WORDS[m.indexIlluminant]})`
          : '— (the reproduction reflects nothing in part of the spectrum, so it cannot be corrected)'}
        : the difference under a test light after the pair's difference in daylight ({m.referenceIlluminant}) is taken
        out by the multiplicative correction of the tristimulus values (CIE 015; the correction recalled from memory).
        XYZ from the spectra by the ASTM E308 method with the CIE 015:2018 tables.
      </p>
    </section>
  );
}
