import { useEffect, useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { seriesCreateSchema } from '../../../../shared/schemas/series';
import { FormAlert } from '../../../components/form/FormAlert';
import { Select } from '../../../components/form/Select';
import { formMessage, useFormErrors } from '../../../lib/form';
import { paths } from '../../../paths';
import { previewCells, useCreateSeries } from '../api';
import { FactorEditor, toFactor, type FactorDraft } from './FactorEditor';

const START: FactorDraft[] = [
  { name: 'madder', role: 'dyestuff', refName: 'madder', levels: '25, 50, 100', mordants: '' },
  {
    name: 'mordant',
    role: 'mordant',
    refName: '',
    levels: '',
    mordants:
      'strong Al = potash alum 15; weak Al = potash alum 5; Fe = iron(II) sulfate (copperas) 2; Al+Fe = potash alum 10 + iron(II) sulfate (copperas) 1',
  },
  { name: 'tannin', role: 'tannin', refName: 'tannic acid', levels: '0, 10', mordants: '' },
];

// Empty is "not given" (a default or "Enter …"); other text goes as typed so the message says "as a number".
const num = (v: FormDataEntryValue | null) =>
  v === null || String(v).trim() === '' ? undefined : Number.isFinite(Number(v)) ? Number(v) : String(v);

export function NewSeriesForm() {
  const [factors, setFactors] = useState<FactorDraft[]>(START);
  const [count, setCount] = useState<number | null>(null);
  const { formRef, errors, check, fromServer, under } = useFormErrors();
  const [kind, setKind] = useState<'series' | 'workshop'>('series');
  const create = useCreateSeries();
  const navigate = useNavigate();

  useEffect(() => {
    const fs = factors.map(toFactor).filter((f) => f.name && f.levels.length);
    if (!fs.length) return setCount(0);
    let live = true;
    previewCells(fs).then(
      (r) => live && setCount(r.count),
      () => live && setCount(null),
    );
    return () => {
      live = false;
    };
  }, [factors]);

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    const data = check(seriesCreateSchema, {
      code: String(f.get('code') ?? ''),
      title: String(f.get('title') ?? ''),
      kind,
      factors: factors.map(toFactor),
      dryMassG: num(f.get('dryMassG')),
      deadVolumePct: num(f.get('deadVolumePct')),
      liquorRatio: num(f.get('liquorRatio')),
      participants: String(f.get('participants') ?? '')
        .split(',')
        .map((p) => p.trim())
        .filter(Boolean),
      heldOn: (f.get('heldOn') as string) || null,
    });
    if (!data) return;
    try {
      const s = await create.mutateAsync(data);
      navigate(paths.seriesOne(s.id));
    } catch (err) {
      fromServer(err);
    }
  }
  const fe = under;
  return (
    <form
      ref={formRef}
      onSubmit={onSubmit}
      noValidate
      className="mb-8 space-y-3 rounded-md border border-rule bg-sheet p-4"
      aria-label="New series"
    >
      <div className="grid gap-3 sm:grid-cols-3">
        <Field label="Code" name="code" placeholder="WS-2024-02" error={fe('code')} />
        <Field label="Title" name="title" className="sm:col-span-2" error={fe('title')} />
        <Select
          label="Kind"
          value={kind}
          onChange={(e) => setKind(e.target.value as 'series' | 'workshop')}
          options={[
            { value: 'series', label: 'series' },
            { value: 'workshop', label: 'workshop' },
          ]}
          error={fe('kind')}
        />
        <Field
          label="Dry mass per cell"
          unit="g"
          name="dryMassG"
          type="number"
          step="any"
          min="0"
          defaultValue={10}
          error={fe('dryMassG')}
        />
        <Field
          label="Liquor ratio 1:"
          name="liquorRatio"
          type="number"
          min="1"
          defaultValue={30}
          error={fe('liquorRatio')}
        />
        <Field
          label="Dead-volume allowance"
          unit="%"
          name="deadVolumePct"
          type="number"
          min="0"
          max="100"
          defaultValue={10}
          error={fe('deadVolumePct')}
        />
        <Field label="Held on" name="heldOn" type="date" error={fe('heldOn')} />
        {kind === 'workshop' ? (
          <Field
            label="Participant codes (pseudonymous)"
            name="participants"
            placeholder="P-01, P-02, P-03"
            error={fe('participants')}
          />
        ) : null}
      </div>
      <FactorEditor factors={factors} onChange={setFactors} errors={errors} />
      <p className="text-sm num" aria-live="polite">
        {count == null ? '' : `${count} cells before pruning`}
      </p>
      <FormAlert message={formMessage(create.error) ?? errors._?.join(' ') ?? null} />
      <Button type="submit" disabled={create.isPending}>
        Create series
      </Button>
    </form>
  );
}
