import { Link, useParams } from 'react-router-dom';
import { Page } from '../../../components/Page';
import { paths } from '../../../paths';
import { useBatch } from '../api';
import { Cautions } from './Cautions';
import { EventForms } from './EventForms';
import { LedgerTable } from './LedgerTable';
import { TimelineChart } from './TimelineChart';

const Figure = ({ label, value, note }: { label: string; value: string; note?: string }) => (
  <div className="rounded-md border border-rule bg-sheet px-4 py-3">
    <dt className="text-xs text-ink-soft">{label}</dt>
    <dd className="num text-xl">{value}</dd>
    {note ? <dd className="text-xs text-ink-faint">{note}</dd> : null}
  </div>
);

export function BathPage() {
  const id = Number(useParams().id);
  const q = useBatch(id);
  if (q.isPending) return <p>Loading…</p>;
  if (q.isError) return <p role="alert">{q.error.message}</p>;
  const b = q.data;
  return (
    <Page
      title={`${b.code} · ${b.name}`}
      lead={`${b.kind.replace('-', ' ')}, made ${b.madeOn}${b.checkBy ? `, check by ${b.checkBy}` : ''}. Status: ${b.status}.`}
      actions={
        <a
          className="rounded-md border border-rule-strong bg-sheet px-4 py-2 text-sm"
          href={`/api/batches/${b.id}/label.pdf`}
        >
          Jar label (PDF)
        </a>
      }
    >
      <dl className="grid grid-cols-2 md:grid-cols-4 gap-3 mb-6">
        <Figure label="Remaining" value={`${b.remainingMl} mL`} note={`of ${b.volumeMl} mL made`} />
        <Figure label="Uses" value={String(b.uses)} />
        <Figure label="Fibre treated" value={`${b.fibreMassG} g`} />
        <Figure
          label="Strength (estimate)"
          value={`${Math.round(b.estimatedStrength.value * 100)} %`}
          note={
            b.uptake.drawOnly
              ? 'only drawn from: uses take volume, not strength'
              : `uptake ${Math.round(b.uptake.value * 100)} % per use of ${b.uptake.referenceLoadG} g fibre (scaled by the fibre mass), an estimate`
          }
        />
      </dl>
      {b.dueForCheck ? (
        <p role="status" className="mb-4 rounded-md bg-warn-tint px-3 py-2 text-sm text-warn">
          Due for a check since {b.checkBy}.
        </p>
      ) : null}
      {b.testStripPrompt && b.status === 'active' ? (
        <p role="status" className="mb-4 rounded-md bg-warn-tint px-3 py-2 text-sm text-warn">
          {b.testStripPrompt}
        </p>
      ) : null}
      <div className="grid gap-6 lg:grid-cols-2">
        <section aria-labelledby="ingr">
          <h2 id="ingr" className="text-xl font-semibold mb-2">
            Ingredients
          </h2>
          <ul className="text-sm num">
            {b.ingredients.map((i) => (
              <li key={`${i.kind}${i.refId}`}>
                {i.name}: {i.grams} g
              </li>
            ))}
            <li>Made up to {b.volumeMl} mL with water</li>
            {b.thickenerGPerL != null ? <li>Thickener: {b.thickenerGPerL} g/L</li> : null}
            {b.ph != null ? <li>pH: {b.ph}</li> : null}
          </ul>
          {b.made ? (
            <div className="mt-3 text-sm" data-testid="bath-made">
              <h3 className="font-semibold">What this charge makes</h3>
              <p className="num">
                {b.made.active.grams} g {b.made.active.name} ({b.made.active.formula}): {b.made.active.gPerL} g/L as
                made
                {b.made.metal ? `, ${b.made.metal.gPerL} g ${b.made.metal.symbol}/L` : ''}
                {b.remainingMl > 0 ? `; now about ${b.made.active.nowGPerL.value} g/L (estimate).` : '; none left now.'}
              </p>
              <p className="num">
                {b.made.limiting} runs out first
                {b.made.excess.length
                  ? `; left over: ${b.made.excess.map((x) => `${x.grams} g ${x.name}`).join(', ')}`
                  : ''}
                . Settles out:{' '}
                {b.made.byProducts
                  .filter((x) => x.fate === 'precipitate')
                  .map((x) => `${x.grams} g ${x.name}`)
                  .join(', ') || 'nothing'}
                .
              </p>
              <p className="text-xs text-ink-faint">
                {b.made.reaction}. {b.made.note} Source: {b.made.source}.
              </p>
            </div>
          ) : null}
          {b.parent ? (
            <p className="mt-2 text-sm">
              Dilution of{' '}
              <Link className="text-action underline" to={paths.bath(b.parent.id)}>
                {b.parent.code}
              </Link>
            </p>
          ) : null}
          {b.children.length ? (
            <p className="mt-2 text-sm">
              Dilutions:{' '}
              {b.children.map((c) => (
                <Link key={c.id} className="text-action underline mr-2" to={paths.bath(c.id)}>
                  {c.code}
                </Link>
              ))}
            </p>
          ) : null}
          {b.topUpSuggestion && b.status === 'active' ? (
            <div className="mt-4">
              <h3 className="font-semibold">Suggested top-up (estimate)</h3>
              <ul className="text-sm num">
                {b.topUpSuggestion.items.map((t) => (
                  <li key={`${t.refId}${t.name}`}>
                    {t.name}: {t.grams} g
                  </li>
                ))}
                <li>
                  {b.topUpSuggestion.waterMl > 0
                    ? `Water back to the made volume: ${b.topUpSuggestion.waterMl} mL`
                    : `No water: the bath holds ${b.topUpSuggestion.volumeAfterMl} mL, at or above the made volume`}
                </li>
              </ul>
              <p className="text-xs text-ink-faint">{b.topUpSuggestion.rule}</p>
            </div>
          ) : null}
        </section>
        <section aria-labelledby="tl">
          <h2 id="tl" className="text-xl font-semibold mb-2">
            Timeline
          </h2>
          <TimelineChart points={b.timeline} volumeMl={b.volumeMl} />
        </section>
      </div>
      <section aria-labelledby="caut" className="mt-6">
        <h2 id="caut" className="text-xl font-semibold mb-2">
          Cautions
        </h2>
        <Cautions items={b.cautions} />
      </section>
      {b.abilities['batch-event:create'] && b.status !== 'disposed' ? (
        <section aria-labelledby="rec" className="mt-6">
          <h2 id="rec" className="text-xl font-semibold mb-2">
            Record an event
          </h2>
          <EventForms batch={b} />
        </section>
      ) : null}
      <section aria-labelledby="led" className="mt-6">
        <h2 id="led" className="text-xl font-semibold mb-2">
          Ledger
        </h2>
        <LedgerTable batch={b} />
        <p className="mt-2 text-xs text-ink-faint">{b.disposalNotice}</p>
      </section>
    </Page>
  );
}
