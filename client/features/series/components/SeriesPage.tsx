import { useEffect, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Button } from '../../../components/Button';
import { Page } from '../../../components/Page';
import { ApiError } from '../../../lib/http';
import { formMessage, useFormErrors } from '../../../lib/form';
import { FormAlert } from '../../../components/form/FormAlert';
import { paths } from '../../../paths';
import { useCreateSeriesTrials, useSeries, useUpdateSeries, type SeriesDetail } from '../api';
import { MaterialsTable } from './MaterialsTable';
import { seriesUpdateSchema } from '../../../../shared/schemas/series';
import { TargetSelect, targetIds, targetValue } from '../../trials';

/** The colour of the piece the series aims at; trials planned from now on take it as their target. */
function SeriesTarget({ s, canEdit }: { s: SeriesDetail; canEdit: boolean }) {
  const update = useUpdateSeries(s.id);
  const saved = targetValue(s.target);
  const [value, setValue] = useState(saved);
  useEffect(() => setValue(saved), [saved]);
  const { formRef, errors, check, fromServer } = useFormErrors();
  if (s.pieceId == null) return null;
  const save = () => {
    const body = targetIds(value);
    if (check(seriesUpdateSchema, body)) update.mutate(body, { onError: fromServer });
  };
  return (
    <section aria-labelledby="target" className="mb-8 max-w-2xl">
      <h2 id="target" className="text-xl font-semibold mb-2">
        Target colour
      </h2>
      <p className="text-sm text-ink-soft mb-2">
        Trials planned from this series compare their swatch with this colour of the piece (ΔE00 on each card).
      </p>
      {canEdit ? (
        <form
          ref={formRef}
          noValidate
          aria-label="Target colour"
          className="space-y-2"
          onSubmit={(e) => {
            e.preventDefault();
            save();
          }}
        >
          <div className="flex flex-wrap items-end gap-2">
            <div className="grow">
              <TargetSelect
                pieceId={s.pieceId}
                value={value}
                onChange={setValue}
                error={
                  errors.target ?? errors.targetPaletteColourId ?? errors.targetRegionId ?? errors.targetMeasurementId
                }
              />
            </div>
            <Button type="submit" variant="secondary" disabled={value === saved || update.isPending}>
              Save target
            </Button>
          </div>
          <FormAlert message={formMessage(update.error)} />
        </form>
      ) : (
        <p className="text-sm">{saved ? 'Set: see the planned trials for the colour.' : 'No target colour.'}</p>
      )}
    </section>
  );
}

export function SeriesPage() {
  const id = Number(useParams().id);
  const q = useSeries(id);
  const update = useUpdateSeries(id);
  const makeTrials = useCreateSeriesTrials(id);
  const [keep, setKeep] = useState<Set<string>>(new Set());
  useEffect(() => {
    if (q.data) setKeep(new Set(q.data.cells.filter((c) => c.kept).map((c) => c.key)));
  }, [q.data]);
  if (q.isPending) return <p>Loading…</p>;
  if (q.isError) return <p role="alert">{q.error.message}</p>;
  const s = q.data;
  const canEdit = s.abilities['series:update'];
  const dirty = s.cells.some((c) => c.kept !== keep.has(c.key));
  const toggle = (key: string) =>
    setKeep((k) => {
      const n = new Set(k);
      if (n.has(key)) n.delete(key);
      else n.add(key);
      return n;
    });
  const err = (e: unknown) => (e instanceof ApiError ? e.message : null);
  return (
    <Page
      title={`${s.code} · ${s.title}`}
      lead={`${s.kind}; ${s.keptCount} of ${s.cells.length} cells kept; ${s.dryMassG ?? '—'} g dry per cell at 1:${s.liquorRatio}.`}
      actions={
        <>
          <a
            className="rounded-md border border-rule-strong bg-sheet px-4 py-2 text-sm"
            href={`/api/series/${s.id}/cards.pdf`}
          >
            Sample cards (PDF)
          </a>
          <a
            className="rounded-md border border-rule-strong bg-sheet px-4 py-2 text-sm"
            href={`/api/series/${s.id}/labels.pdf`}
          >
            Labels (PDF)
          </a>
        </>
      }
    >
      <SeriesTarget s={s} canEdit={canEdit} />
      <section aria-labelledby="cells" className="mb-8">
        <h2 id="cells" className="text-xl font-semibold mb-2">
          Cells
        </h2>
        <p className="text-sm text-ink-soft mb-2">
          Untick a cell to prune it; recipes are scaled to {s.dryMassG ?? '—'} g of dry fibre.
        </p>
        <div className="grid gap-2 sm:grid-cols-2 lg:grid-cols-3">
          {s.cells.map((c) => (
            <label
              key={c.key}
              className={`rounded-md border p-2 text-sm ${keep.has(c.key) ? 'border-rule-strong bg-sheet' : 'border-rule bg-paper text-ink-faint line-through'}`}
            >
              <input
                type="checkbox"
                className="mr-2"
                checked={keep.has(c.key)}
                disabled={!canEdit}
                onChange={() => toggle(c.key)}
              />
              {Object.entries(c.cell)
                .map(([k, v]) => `${k} ${v}`)
                .join(' · ')}
              <span className="block num text-xs text-ink-soft no-underline">
                {c.recipe.flatMap((st) => st.ingredients.map((i) => `${i.name} ${i.grams} g`)).join(', ') ||
                  'no recipe ingredients'}
              </span>
            </label>
          ))}
        </div>
        {canEdit ? (
          <div className="mt-3 flex flex-wrap gap-2 items-center">
            <Button
              variant="secondary"
              disabled={!dirty || update.isPending}
              onClick={() => update.mutate({ keep: [...keep] })}
            >
              Save pruning
            </Button>
            <Button disabled={dirty || makeTrials.isPending} onClick={() => makeTrials.mutate()}>
              Create planned trials
            </Button>
            {(err(update.error) ?? err(makeTrials.error)) ? (
              <span role="alert" className="text-sm text-danger">
                {err(update.error) ?? err(makeTrials.error)}
              </span>
            ) : null}
            {makeTrials.data ? (
              <span role="status" className="text-sm text-ok">
                {makeTrials.data.created.length} trials created.
              </span>
            ) : null}
          </div>
        ) : null}
      </section>
      {s.materials ? (
        <section aria-labelledby="mat" className="mb-8 grid gap-6 lg:grid-cols-2">
          <div>
            <h2 id="mat" className="text-xl font-semibold mb-2">
              Materials for the whole {s.kind}
            </h2>
            <MaterialsTable
              m={s.materials.whole}
              deadVolumePct={s.materials.deadVolumePct}
              label="Materials for the whole series"
            />
            {s.materials.unresolved.length ? (
              <p className="text-sm text-warn">Not computed: {s.materials.unresolved.join(', ')}.</p>
            ) : null}
          </div>
          {s.materials.perParticipant.length ? (
            <div>
              <h2 className="text-xl font-semibold mb-2">Per participant</h2>
              <p className="text-sm text-ink-soft mb-2">
                Each of {s.materials.perParticipant.map((p) => p.code).join(', ')} needs:
              </p>
              <MaterialsTable
                m={s.materials.perParticipant[0]}
                deadVolumePct={s.materials.deadVolumePct}
                label="Materials per participant"
              />
            </div>
          ) : null}
        </section>
      ) : (
        <p className="mb-8 text-sm text-ink-faint">Set the dry mass per cell to see the materials.</p>
      )}
      <section aria-labelledby="tr">
        <h2 id="tr" className="text-xl font-semibold mb-2">
          Trials
        </h2>
        {s.trials.length ? (
          <ul className="grid gap-1 sm:grid-cols-2 lg:grid-cols-3 text-sm">
            {s.trials.map((t) => (
              <li key={t.id}>
                <Link className="text-action underline num" to={paths.trial(t.id)}>
                  {t.code}
                </Link>{' '}
                <span className="text-ink-soft">
                  {Object.values(t.cell ?? {}).join(' · ')} ({t.status})
                </span>
              </li>
            ))}
          </ul>
        ) : (
          <p className="text-sm text-ink-faint">No trials yet.</p>
        )}
      </section>
    </Page>
  );
}
