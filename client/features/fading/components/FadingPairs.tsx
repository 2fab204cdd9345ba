import { useState } from 'react';
import { Link } from 'react-router-dom';
import { conditionsText } from '../../../../shared/colour/conditions';
import { labToHex } from '../../../../shared/colour/convert';
import { formatNumber } from '../../../../shared/format';
import { VARIANT_WORDS } from '../../../../shared/schemas/chart';
import { fadingPairCreateSchema, type FadingPairOut } from '../../../../shared/schemas/fading';
import { Button } from '../../../components/Button';
import { formMessage, useFormErrors } from '../../../lib/form';
import { paths } from '../../../paths';
import { useAddFadingPair, useFadingPairs, useRemoveFadingPair } from '../api';

type Side = FadingPairOut['faded'];
const sideValue = (s: Side) => `${s.kind === 'region' ? 'region' : 'measurement'}:${s.id}`;
/** "region:4" → { regionId: 4 }; empty → undefined so the schema says what is missing. */
const sideInput = (v: string) => {
  const [kind, id] = v.split(':');
  if (!id) return undefined;
  return kind === 'region' ? { regionId: Number(id) } : { measurementId: Number(id) };
};
const f1 = (v: number) => formatNumber(v, 1);

function SideCell({ side }: { side: Side }) {
  return (
    <span className="inline-flex items-center gap-2">
      {side.lab ? (
        <span
          className="inline-block h-5 w-5 rounded border border-rule-strong"
          style={{ background: labToHex(side.lab) }}
          aria-hidden="true"
        />
      ) : null}
      <span>
        {side.label}
        <span className="block text-xs text-ink-soft num">
          {side.lab ? `L* ${f1(side.lab.L)} a* ${f1(side.lab.a)} b* ${f1(side.lab.b)} · ` : 'no colour yet · '}
          {conditionsText(side)}
          {side.variant ? ` · ${VARIANT_WORDS[side.variant]}` : ''}
        </span>
      </span>
    </span>
  );
}

/**
 * A piece's fading pairs: a faded area beside a protected one (a fold, a seam allowance, the back of a hem), with
 * ΔE00, ΔL*, ΔC*, ΔH* (protected as the standard) and the ISO 105-A05 grade; a trial can aim at either side.
 */
export function FadingPairs({ pieceId, canEdit }: { pieceId: number; canEdit: boolean }) {
  const list = useFadingPairs(pieceId);
  const add = useAddFadingPair(pieceId);
  const remove = useRemoveFadingPair(pieceId);
  const [faded, setFaded] = useState('');
  const [prot, setProt] = useState('');
  const [label, setLabel] = useState('');
  const { formRef, errors, check, show, fromServer } = useFormErrors();
  if (list.isPending) return <p className="text-sm">Loading fading pairs…</p>;
  if (list.isError) return null;
  const { items, candidates } = list.data;

  async function submit() {
    const data = check(fadingPairCreateSchema, {
      label: label.trim() || null,
      faded: sideInput(faded),
      protected: sideInput(prot),
    });
    if (!data) return;
    try {
      await add.mutateAsync(data);
      setFaded('');
      setProt('');
      setLabel('');
    } catch (e) {
      const message = formMessage(e);
      if (message) show({ _: [message] });
      else fromServer(e);
    }
  }

  const options = (
    <>
      <option value="">Choose…</option>
      <optgroup label="Regions of photos">
        {candidates.regions.map((r) => (
          <option key={`r${r.id}`} value={`region:${r.id}`}>
            {r.label}
          </option>
        ))}
      </optgroup>
      <optgroup label="Readings">
        {candidates.readings.map((m) => (
          <option key={`m${m.id}`} value={`measurement:${m.id}`}>
            {m.label}
          </option>
        ))}
      </optgroup>
    </>
  );
  const sideError = (k: 'faded' | 'protected') => errors[k] ?? errors[`${k}.regionId`] ?? errors[`${k}.measurementId`];

  return (
    <section className="space-y-4" data-testid="fading-pairs">
      <h2 className="font-serif text-2xl">Fading pairs</h2>
      {items.length === 0 ? <p className="text-sm text-ink-soft">No fading pairs yet.</p> : null}
      <ul className="space-y-3">
        {items.map((p) => (
          <li key={p.id} className="rounded-md border border-rule p-3 text-sm" data-testid="fading-pair">
            {p.label ? <p className="font-medium">{p.label}</p> : null}
            <div className="grid gap-2 sm:grid-cols-2">
              <div>
                <span className="text-xs uppercase text-ink-soft">As made (protected)</span>
                <br />
                <SideCell side={p.protected} />
              </div>
              <div>
                <span className="text-xs uppercase text-ink-soft">As seen (faded)</span>
                <br />
                <SideCell side={p.faded} />
              </div>
            </div>
            {p.difference ? (
              <p className="num mt-2">
                ΔE00 <strong>{f1(p.difference.deltaE00)}</strong> · ΔL* {f1(p.difference.components.dL)} · ΔC*{' '}
                {f1(p.difference.components.dC)} · ΔH* {f1(p.difference.components.dH)} · ISO 105-A05 grade{' '}
                {p.difference.a05 ? (
                  <strong>
                    {p.difference.a05.step} ({formatNumber(p.difference.a05.grade, 2)})
                  </strong>
                ) : (
                  'not yet computed'
                )}
              </p>
            ) : null}
            {p.note ? <p className="mt-1 text-xs text-ink-soft">{p.note}</p> : null}
            <p className="mt-2 flex flex-wrap gap-3">
              <Link
                className="text-action hover:underline"
                to={paths.trialNew(pieceId, sideValue(p.protected), 'as-made')}
              >
                Aim a trial at it as made
              </Link>
              <Link className="text-action hover:underline" to={paths.trialNew(pieceId, sideValue(p.faded), 'as-seen')}>
                Aim a trial at it as seen
              </Link>
              {canEdit ? (
                <button type="button" className="text-danger hover:underline" onClick={() => remove.mutate(p.id)}>
                  Remove pair
                </button>
              ) : null}
            </p>
          </li>
        ))}
      </ul>
      {canEdit ? (
        <form
          ref={formRef}
          aria-label="New fading pair"
          className="grid gap-3 sm:grid-cols-3"
          onSubmit={(e) => {
            e.preventDefault();
            void submit();
          }}
        >
          {(
            [
              ['faded', 'Faded area (as seen)', faded, setFaded],
              ['protected', 'Protected area (as made)', prot, setProt],
            ] as const
          ).map(([k, text, value, set]) => (
            <label key={k} className="block text-sm font-medium">
              {text}
              <select
                className={`mt-1 block w-full rounded-md border bg-sheet px-2 py-2 text-sm ${sideError(k) ? 'border-danger' : 'border-rule-strong'}`}
                aria-invalid={sideError(k) ? true : undefined}
                value={value}
                onChange={(e) => set(e.target.value)}
              >
                {options}
              </select>
              {sideError(k) ? <span className="mt-1 block text-sm text-danger">{sideError(k)!.join(' ')}</span> : null}
            </label>
          ))}
          <label className="block text-sm font-medium">
            Label
            <input
              className="mt-1 block w-full rounded-md border border-rule-strong bg-sheet px-3 py-2 text-sm"
              value={label}
              placeholder="e.g. madder band, fold at the hem"
              onChange={(e) => setLabel(e.target.value)}
            />
          </label>
          {errors._ ? (
            <p role="alert" className="text-sm text-danger sm:col-span-3">
              {errors._.join(' ')}
            </p>
          ) : null}
          <div className="sm:col-span-3">
            <Button type="submit" disabled={add.isPending}>
              Pair them
            </Button>
          </div>
        </form>
      ) : null}
    </section>
  );
}
