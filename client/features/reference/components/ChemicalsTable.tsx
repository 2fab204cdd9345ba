import { Fragment, useId, useState } from 'react';
import { CHEMICAL_ROLES, CHEMICAL_STATUSES, type ChemicalView } from '../../../../shared/schemas/reference';
import { ChemicalCaution } from './ChemicalCaution';
import { Formula } from './Formula';
import { StatusBadge } from './StatusBadge';

const fmtMolar = (m: number | null) => (m == null ? '—' : m.toFixed(2));
const fmtFraction = (f: number | null) => (f == null ? '' : `${(f * 100).toFixed(2)} %`);

export function ChemicalsTable({ chemicals }: { chemicals: ChemicalView[] }) {
  const [status, setStatus] = useState<'' | ChemicalView['status']>('');
  const [role, setRole] = useState<'' | ChemicalView['role']>('');
  const [text, setText] = useState('');
  const ids = { status: useId(), role: useId(), text: useId() };
  const q = text.trim().toLowerCase();
  const shown = chemicals.filter(
    (c) =>
      (!status || c.status === status) &&
      (!role || c.role === role) &&
      (!q || c.name.toLowerCase().includes(q) || (c.formula ?? '').toLowerCase().includes(q)),
  );
  const select = 'mt-1 block rounded-md border border-rule-strong bg-sheet px-2 py-1.5 text-sm';
  return (
    <div>
      <div className="flex flex-wrap gap-4 mb-3 items-end">
        <div>
          <label htmlFor={ids.text} className="text-sm font-medium">
            Name or formula
          </label>
          <input
            id={ids.text}
            type="search"
            value={text}
            onChange={(e) => setText(e.target.value)}
            className={`${select} w-56`}
          />
        </div>
        <div>
          <label htmlFor={ids.role} className="text-sm font-medium">
            Role
          </label>
          <select
            id={ids.role}
            value={role}
            onChange={(e) => setRole(e.target.value as typeof role)}
            className={select}
          >
            <option value="">any</option>
            {CHEMICAL_ROLES.map((r) => (
              <option key={r}>{r}</option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor={ids.status} className="text-sm font-medium">
            Status
          </label>
          <select
            id={ids.status}
            value={status}
            onChange={(e) => setStatus(e.target.value as typeof status)}
            className={select}
          >
            <option value="">any</option>
            {CHEMICAL_STATUSES.map((s) => (
              <option key={s} value={s}>
                {s.replace('-', ' ')}
              </option>
            ))}
          </select>
        </div>
        <p className="text-sm text-ink-faint num" aria-live="polite">
          {shown.length} of {chemicals.length} chemicals
        </p>
      </div>
      <div className="overflow-x-auto rounded-lg border border-rule bg-sheet">
        <table className="w-full text-sm">
          <caption className="sr-only">
            Chemicals with formula, molar mass, metal content, status and safety caution
          </caption>
          <thead className="bg-paper text-left text-ink-soft">
            <tr>
              <th scope="col" className="px-3 py-2 font-medium">
                Chemical
              </th>
              <th scope="col" className="px-3 py-2 font-medium">
                Role
              </th>
              <th scope="col" className="px-3 py-2 font-medium">
                Formula
              </th>
              <th scope="col" className="px-3 py-2 font-medium text-right">
                Molar mass (g/mol)
              </th>
              <th scope="col" className="px-3 py-2 font-medium">
                Metal (mass fraction)
              </th>
              <th scope="col" className="px-3 py-2 font-medium">
                Status
              </th>
            </tr>
          </thead>
          <tbody>
            {shown.map((c) => (
              <Fragment key={c.id}>
                <tr className="border-t border-rule align-top" data-testid={`chemical-${c.id}`}>
                  <th scope="row" className="px-3 pt-2 text-left font-medium">
                    {c.name}
                  </th>
                  <td className="px-3 pt-2 text-ink-soft">{c.role}</td>
                  <td className="px-3 pt-2">
                    {c.formula ? (
                      <Formula formula={c.formula} />
                    ) : (
                      <span className="text-ink-faint">no fixed formula</span>
                    )}
                  </td>
                  <td className="px-3 pt-2 text-right font-mono num">{fmtMolar(c.molarMass)}</td>
                  <td className="px-3 pt-2 font-mono num whitespace-nowrap">
                    {c.metal ? (
                      `${c.metal} ${fmtFraction(c.metalMassFraction)}`
                    ) : (
                      <span className="text-ink-faint">—</span>
                    )}
                  </td>
                  <td className="px-3 pt-2">
                    <StatusBadge status={c.status} />
                  </td>
                </tr>
                <tr>
                  <td colSpan={6} className="px-3 pb-3 pt-1">
                    <ChemicalCaution chemical={c} compact />
                  </td>
                </tr>
              </Fragment>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
