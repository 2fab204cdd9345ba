import { useEffect, useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { ApiError } from '../../../lib/http';
import { paths } from '../../../paths';
import { previewCells, useCreateSeries } from '../api';
import { FactorEditor, toFactor, type FactorDraft } from './FactorEditor';

const START: FactorDraft[] = [
  { name: 'madder', role: 'dyestuff', refName: 'madder', levels: '25, 50, 100', mordants: '' },
  { name: 'mordant', role: 'mordant', refName: '', levels: '', mordants: 'strong Al = potash alum 15; weak Al = potash alum 5; Fe = iron(II) sulfate (copperas) 2; Al+Fe = potash alum 10 + iron(II) sulfate (copperas) 1' },
  { name: 'tannin', role: 'tannin', refName: 'tannic acid', levels: '0, 10', mordants: '' },
];

export function NewSeriesForm() {
  const [factors, setFactors] = useState<FactorDraft[]>(START);
  const [count, setCount] = useState<number | null>(null);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [kind, setKind] = useState<'series' | 'workshop'>('series');
  const create = useCreateSeries();
  const navigate = useNavigate();

  useEffect(() => {
    const fs = factors.map(toFactor).filter((f) => f.name && f.levels.length);
    if (!fs.length) return setCount(0);
    let live = true;
    previewCells(fs).then((r) => live && setCount(r.count), () => live && setCount(null));
    return () => { live = false; };
  }, [factors]);

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    setErrors({});
    try {
      const s = await create.mutateAsync({
        code: String(f.get('code') ?? ''), title: String(f.get('title') ?? ''), kind, factors: factors.map(toFactor) as never,
        dryMassG: Number(f.get('dryMassG')), deadVolumePct: Number(f.get('deadVolumePct')), liquorRatio: Number(f.get('liquorRatio')),
        participants: String(f.get('participants') ?? '').split(',').map((p) => p.trim()).filter(Boolean), heldOn: (f.get('heldOn') as string) || null,
      });
      navigate(paths.seriesOne(s.id));
    } catch (err) {
      if (err instanceof ApiError && err.details?.fields) setErrors(err.details.fields);
    }
  }
  const fe = (k: string) => Object.entries(errors).filter(([key]) => key === k || key.startsWith(`${k}.`)).flatMap(([, v]) => v);
  const formError = create.error instanceof ApiError && !create.error.details?.fields ? create.error.message : null;
  return (
    <form onSubmit={onSubmit} noValidate className="mb-8 space-y-3 rounded-md border border-rule bg-sheet p-4" aria-label="New series">
      <div className="grid gap-3 sm:grid-cols-3">
        <Field label="Code" name="code" placeholder="WS-2024-02" error={fe('code')} />
        <Field label="Title" name="title" className="sm:col-span-2" error={fe('title')} />
        <label className="text-sm font-medium">Kind
          <select className="mt-1 block w-full rounded-md border border-rule-strong bg-sheet px-3 py-2 font-normal" value={kind} onChange={(e) => setKind(e.target.value as 'series' | 'workshop')}>
            <option value="series">series</option><option value="workshop">workshop</option>
          </select>
        </label>
        <Field label="Dry mass per cell" unit="g" name="dryMassG" type="number" step="any" min="0" defaultValue={10} error={fe('dryMassG')} />
        <Field label="Liquor ratio 1:" name="liquorRatio" type="number" min="1" defaultValue={30} error={fe('liquorRatio')} />
        <Field label="Dead-volume allowance" unit="%" name="deadVolumePct" type="number" min="0" max="100" defaultValue={10} error={fe('deadVolumePct')} />
        <Field label="Held on" name="heldOn" type="date" error={fe('heldOn')} />
        {kind === 'workshop' ? <Field label="Participant codes (pseudonymous)" name="participants" placeholder="P-01, P-02, P-03" error={fe('participants')} /> : null}
      </div>
      <FactorEditor factors={factors} onChange={setFactors} error={fe('factors')} />
      <p className="text-sm num" aria-live="polite">{count == null ? '' : `${count} cells before pruning`}</p>
      {formError ? <p role="alert" className="rounded-md bg-danger-tint px-3 py-2 text-sm text-danger">{formError}</p> : null}
      <Button type="submit" disabled={create.isPending}>Create series</Button>
    </form>
  );
}
