import type { FactorInput } from '../../../../shared/schemas/series';
import { errorsUnder, type FieldErrors } from '../../../lib/form';

export type FactorDraft = {
  name: string;
  role: FactorInput['role'];
  refName: string;
  levels: string;
  mordants: string;
};

/** "strong Al = potash alum 15; weak Al = potash alum 5" → mordant levels with their chemicals in % owf. */
export function parseMordants(text: string) {
  return text
    .split(/[;\n]/)
    .map((s) => s.trim())
    .filter(Boolean)
    .map((entry) => {
      const [level, rest = ''] = entry.split('=').map((x) => x.trim());
      const chemicals = rest.split('+').map((c) => {
        const m = c.trim().match(/^(.*\S)\s+([\d.]+)$/);
        return m ? { refId: null, name: m[1], owf: Number(m[2]) } : { refId: null, name: c.trim(), owf: 0 };
      });
      return { level, chemicals };
    });
}

export function toFactor(d: FactorDraft) {
  const levels =
    d.role === 'mordant' && d.mordants.trim()
      ? parseMordants(d.mordants).map((m) => m.level)
      : d.levels
          .split(',')
          .map((l) => l.trim())
          .filter(Boolean);
  return {
    name: d.name.trim(),
    role: d.role,
    refId: null,
    refName: d.refName.trim() || null,
    levels,
    ...(d.role === 'mordant' ? { mordants: parseMordants(d.mordants) } : {}),
  };
}

const input = 'mt-1 block w-full rounded-md border border-rule-strong bg-sheet px-2 py-1.5 text-sm font-normal';

export function FactorEditor({
  factors,
  onChange,
  errors = {},
}: {
  factors: FactorDraft[];
  onChange: (f: FactorDraft[]) => void;
  errors?: FieldErrors;
}) {
  const set = (i: number, patch: Partial<FactorDraft>) =>
    onChange(factors.map((f, j) => (j === i ? { ...f, ...patch } : f)));
  // Messages of one factor's name, and of its levels (a mordant's chemicals count as its levels).
  const gather = (prefix: string) => errorsUnder(errors, prefix) ?? [];
  const nameErr = (i: number) => gather(`factors.${i}.name`);
  const levelErr = (i: number) => [...gather(`factors.${i}.levels`), ...gather(`factors.${i}.mordants`)];
  const rowErr = (i: number) => [...gather(`factors.${i}.role`), ...gather(`factors.${i}.refName`)];
  const listErr = errors.factors ?? [];
  const bad = (e: string[]) =>
    e.length ? { 'aria-invalid': true as const, className: `${input} border-danger` } : { className: input };
  const msg = (e: string[]) => (e.length ? <span className="mt-1 block text-danger">{e.join(' ')}</span> : null);
  return (
    <fieldset className="space-y-3">
      <legend className="text-sm font-medium">Factors and levels</legend>
      {factors.map((f, i) => (
        <div
          key={i}
          className="grid gap-2 sm:grid-cols-[8rem_8rem_1fr_2fr_auto] items-end rounded-md border border-rule p-2"
        >
          <label className="text-xs">
            Factor
            <input {...bad(nameErr(i))} value={f.name} onChange={(e) => set(i, { name: e.target.value })} />
            {msg(nameErr(i))}
          </label>
          <label className="text-xs">
            Changes
            <select
              className={input}
              value={f.role}
              onChange={(e) => set(i, { role: e.target.value as FactorDraft['role'] })}
            >
              <option value="dyestuff">dyestuff % owf</option>
              <option value="tannin">tannin % owf</option>
              <option value="mordant">mordant</option>
              <option value="other">other</option>
            </select>
          </label>
          {f.role === 'mordant' ? (
            <label className="text-xs sm:col-span-2">
              Levels, each “level = chemical % owf + …”, separated by “;”
              <input
                {...bad(levelErr(i))}
                value={f.mordants}
                onChange={(e) => set(i, { mordants: e.target.value })}
                placeholder="strong Al = potash alum 15; Fe = iron(II) sulfate (copperas) 2"
              />
              {msg(levelErr(i))}
            </label>
          ) : (
            <>
              <label className="text-xs">
                {f.role === 'dyestuff' ? 'Dyestuff' : f.role === 'tannin' ? 'Tannin' : 'Reference'}
                <input {...bad(rowErr(i))} value={f.refName} onChange={(e) => set(i, { refName: e.target.value })} />
                {msg(rowErr(i))}
              </label>
              <label className="text-xs">
                Levels{f.role === 'other' ? '' : ' (% owf)'}, comma-separated
                <input
                  {...bad(levelErr(i))}
                  value={f.levels}
                  onChange={(e) => set(i, { levels: e.target.value })}
                  placeholder="25, 50, 100"
                />
                {msg(levelErr(i))}
              </label>
            </>
          )}
          <button
            type="button"
            className="text-sm text-danger underline"
            onClick={() => onChange(factors.filter((_, j) => j !== i))}
            aria-label={`Remove factor ${f.name || i + 1}`}
          >
            Remove
          </button>
        </div>
      ))}
      <button
        type="button"
        className="text-sm text-action underline"
        onClick={() => onChange([...factors, { name: '', role: 'other', refName: '', levels: '', mordants: '' }])}
      >
        Add a factor
      </button>
      {listErr.length ? (
        <p className="text-sm text-danger" data-field-error tabIndex={-1}>
          {listErr.join(' ')}
        </p>
      ) : null}
    </fieldset>
  );
}
