import { useState } from 'react';
import { displayCreateSchema, type DisplayCheckResponse, type LightDoseOut } from '../../../../shared/schemas/records';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { FormAlert } from '../../../components/form/FormAlert';
import { formMessage, useFormErrors } from '../../../lib/form';
import { useCheckDisplay, useCreateDisplay, useDisplays } from '../api';

const lxh = (n: number) => `${Math.round(n).toLocaleString('en-GB').replace(/,/g, ' ')} lx·h`;
const pct = (f: number) => `${Math.round(f * 100)} %`;

/** How much of an allowance is used, as a bar with its figure in words (a meter for screen readers). */
function AllowanceBar({ label, fraction, text }: { label: string; fraction: number; text: string }) {
  const over = fraction > 1;
  return (
    <div>
      <div className="flex flex-wrap justify-between gap-2 text-sm">
        <span className="font-medium">{label}</span>
        <span className={`num ${over ? 'text-danger' : ''}`}>{text}</span>
      </div>
      <div
        role="meter"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={Math.round(fraction * 100)}
        aria-valuetext={text}
        className="mt-1 h-3 w-full overflow-hidden rounded bg-paper ring-1 ring-rule"
      >
        <div
          className={`h-full ${over ? 'bg-danger' : fraction > 0.8 ? 'bg-amber-600' : 'bg-action'}`}
          style={{ width: `${Math.min(100, fraction * 100)}%` }}
        />
      </div>
    </div>
  );
}

function DoseSummary({ dose }: { dose: LightDoseOut }) {
  return (
    <div className="space-y-3">
      <p className="text-sm">
        Light sensitivity: <strong>{dose.categoryLabel}</strong>
        {dose.categoryFrom.length
          ? ` (from ${dose.categoryFrom.join(', ')})`
          : ' (no dyestuff recorded: the cautious default)'}
        {dose.annualLimitLuxHours != null ? `; annual limit ${lxh(dose.annualLimitLuxHours)}` : '; no annual limit'}.
      </p>
      <p className="text-sm">
        Total exposure: <strong className="num">{lxh(dose.luxHours)}</strong> over{' '}
        <span className="num">{dose.daysOnDisplay}</span> days on display.
      </p>
      {dose.thisYear.usedFraction != null ? (
        <AllowanceBar
          label={`Allowance used in ${dose.thisYear.year}`}
          fraction={dose.thisYear.usedFraction}
          text={`${lxh(dose.thisYear.luxHours)} of ${lxh(dose.annualLimitLuxHours ?? 0)} (${pct(dose.thisYear.usedFraction)})`}
        />
      ) : null}
      {dose.totalUsedFraction != null && dose.totalAllowanceLuxHours != null ? (
        <AllowanceBar
          label="Allowance used since the first display"
          fraction={dose.totalUsedFraction}
          text={`${lxh(dose.luxHours)} of ${lxh(dose.totalAllowanceLuxHours)} (${pct(dose.totalUsedFraction)})`}
        />
      ) : null}
      <p className="text-xs text-ink-faint">Source: {dose.source}.</p>
    </div>
  );
}

/** Display periods, the cumulative light dose and the allowance used; a curator logs a period, warned first. */
export function LightPanel({ pieceId }: { pieceId: number }) {
  const list = useDisplays(pieceId, true);
  const [open, setOpen] = useState(false);
  if (!list.data) return null;
  const { items, lightDose, canCreate } = list.data;
  return (
    <section className="space-y-4" aria-labelledby="light-h">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="light-h" className="font-serif text-2xl">
          Light exposure
        </h2>
        {canCreate && !open ? (
          <Button variant="secondary" onClick={() => setOpen(true)}>
            Log a display
          </Button>
        ) : null}
      </div>
      <DoseSummary dose={lightDose} />
      {open ? <DisplayForm pieceId={pieceId} onDone={() => setOpen(false)} /> : null}
      {items.length ? (
        <div className="overflow-x-auto">
          <table className="w-full text-sm">
            <caption className="sr-only">Display periods, newest first</caption>
            <thead>
              <tr className="text-left">
                <th scope="col" className="pr-4 font-medium">
                  From
                </th>
                <th scope="col" className="pr-4 font-medium">
                  To
                </th>
                <th scope="col" className="pr-4 font-medium">
                  Illuminance
                </th>
                <th scope="col" className="pr-4 font-medium">
                  Hours a day
                </th>
                <th scope="col" className="pr-4 font-medium">
                  UV
                </th>
                <th scope="col" className="font-medium">
                  Exposure
                </th>
              </tr>
            </thead>
            <tbody className="num">
              {items.map((d) => (
                <tr key={d.id}>
                  <td className="pr-4 whitespace-nowrap">{d.from}</td>
                  <td className="pr-4 whitespace-nowrap">{d.to}</td>
                  <td className="pr-4">{d.lux} lux</td>
                  <td className="pr-4">{d.hoursPerDay} h</td>
                  <td className={`pr-4 ${d.uvAboveGuide ? 'text-danger' : ''}`}>
                    {d.uvMicrowattsPerLumen != null
                      ? `${d.uvMicrowattsPerLumen} µW/lm${d.uvAboveGuide ? ' (above 75)' : ''}`
                      : '—'}
                  </td>
                  <td className="whitespace-nowrap">{lxh(d.luxHours)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : (
        <p className="text-sm text-ink-soft">No display periods logged.</p>
      )}
    </section>
  );
}

function DisplayForm({ pieceId, onDone }: { pieceId: number; onDone: () => void }) {
  const dryCheck = useCheckDisplay(pieceId);
  const create = useCreateDisplay(pieceId);
  const { formRef, errors, check, fromServer } = useFormErrors();
  const [v, setV] = useState({ from: '', to: '', lux: '', hoursPerDay: '', uv: '', place: '' });
  const [warning, setWarning] = useState<DisplayCheckResponse | null>(null);
  const set = (k: keyof typeof v) => (e: React.ChangeEvent<HTMLInputElement>) => {
    setV({ ...v, [k]: e.target.value });
    setWarning(null);
  };
  const num = (s: string) => (s.trim() === '' ? undefined : Number.isNaN(Number(s)) ? s : Number(s));
  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    const input = check(displayCreateSchema, {
      from: v.from || undefined,
      to: v.to || undefined,
      lux: num(v.lux),
      hoursPerDay: num(v.hoursPerDay),
      uvMicrowattsPerLumen: num(v.uv) ?? null,
      place: v.place || null,
    });
    if (!input) return;
    // A warning already shown and accepted: record it with the confirmation.
    if (warning?.exceeds.length) {
      create.mutate({ ...input, confirm: true }, { onSuccess: onDone, onError: fromServer });
      return;
    }
    dryCheck.mutate(input, {
      onError: fromServer,
      onSuccess: (res) => {
        if (res.exceeds.length) setWarning(res);
        else create.mutate(input, { onSuccess: onDone, onError: fromServer });
      },
    });
  };
  return (
    <form ref={formRef} onSubmit={submit} noValidate className="space-y-4 rounded-md border border-rule p-4">
      <div className="grid gap-4 sm:grid-cols-3">
        <Field label="From" type="date" value={v.from} onChange={set('from')} error={errors.from} />
        <Field label="To" type="date" value={v.to} onChange={set('to')} error={errors.to} />
        <Field label="Place" value={v.place} onChange={set('place')} error={errors.place} />
        <Field
          label="Illuminance"
          unit="lux"
          inputMode="decimal"
          value={v.lux}
          onChange={set('lux')}
          error={errors.lux}
        />
        <Field
          label="Hours lit a day"
          unit="h"
          inputMode="decimal"
          value={v.hoursPerDay}
          onChange={set('hoursPerDay')}
          error={errors.hoursPerDay}
        />
        <Field
          label="UV"
          unit="µW/lm"
          inputMode="decimal"
          value={v.uv}
          onChange={set('uv')}
          error={errors.uvMicrowattsPerLumen}
        />
      </div>
      {warning?.message ? (
        <p role="alert" className="rounded-md bg-danger-tint px-3 py-2 text-sm text-danger">
          {warning.message} Save again to record it anyway, or change the period.
        </p>
      ) : null}
      <FormAlert message={formMessage(create.error ?? dryCheck.error)} />
      <div className="flex gap-2">
        <Button type="submit" disabled={create.isPending || dryCheck.isPending}>
          {warning?.exceeds.length ? 'Record it anyway' : 'Save display'}
        </Button>
        <Button type="button" variant="quiet" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
