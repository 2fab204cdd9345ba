import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Page } from '../../../components/Page';
import { paths } from '../../../paths';
import { useCan } from '../../auth';
import { useBatches, type BatchSummary } from '../api';
import { NewBathForm } from './NewBathForm';

function BathTable({ items, label }: { items: BatchSummary[]; label: string }) {
  if (!items.length) return <p className="text-sm text-ink-faint">None.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm" aria-label={label}>
        <thead className="text-left text-ink-soft border-b border-rule">
          <tr>
            <th className="py-2 pr-3">Code</th>
            <th className="pr-3">Name</th>
            <th className="pr-3">Kind</th>
            <th className="pr-3">Status</th>
            <th className="pr-3 text-right">Remaining (mL)</th>
            <th className="pr-3 text-right">Uses</th>
            <th>Check by</th>
          </tr>
        </thead>
        <tbody>
          {items.map((b) => (
            <tr key={b.id} className="border-b border-rule">
              <td className="py-1.5 pr-3">
                <Link className="text-action underline" to={paths.bath(b.id)}>
                  {b.code}
                </Link>
              </td>
              <td className="pr-3">{b.name}</td>
              <td className="pr-3">{b.kind.replace('-', ' ')}</td>
              <td className="pr-3">{b.status}</td>
              <td className="pr-3 text-right num">{b.remainingMl}</td>
              <td className="pr-3 text-right num">{b.uses}</td>
              <td className={`num ${b.dueForCheck ? 'text-warn font-medium' : ''}`}>{b.checkBy ?? '—'}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function BathsPage() {
  const [status, setStatus] = useState('');
  const [kind, setKind] = useState('');
  const all = useBatches({ status: status || undefined, kind: kind || undefined });
  const due = useBatches({ due: true });
  const can = useCan();
  const [adding, setAdding] = useState(false);
  return (
    <Page
      title="Baths"
      lead="Mordant baths, print pastes, dye baths and vats kept in use: each draw, top-up and check in one ledger."
      actions={
        can('batch:create') ? (
          <button className="rounded-md bg-action px-4 py-2 text-sm text-white" onClick={() => setAdding((a) => !a)}>
            {adding ? 'Close' : 'New bath'}
          </button>
        ) : null
      }
    >
      {adding ? <NewBathForm onDone={() => setAdding(false)} /> : null}
      <section aria-labelledby="due" className="mb-8">
        <h2 id="due" className="text-xl font-semibold mb-2">
          Due for a check
        </h2>
        {due.data ? <BathTable items={due.data.items} label="Due for a check" /> : <p>Loading…</p>}
      </section>
      <section aria-labelledby="allb">
        <div className="flex flex-wrap items-end gap-3 mb-2">
          <h2 id="allb" className="text-xl font-semibold mr-auto">
            All baths
          </h2>
          <label className="text-sm">
            Status{' '}
            <select
              className="ml-1 rounded-md border border-rule-strong bg-sheet px-2 py-1"
              value={status}
              onChange={(e) => setStatus(e.target.value)}
            >
              <option value="">any</option>
              <option>active</option>
              <option>exhausted</option>
              <option>disposed</option>
            </select>
          </label>
          <label className="text-sm">
            Kind{' '}
            <select
              className="ml-1 rounded-md border border-rule-strong bg-sheet px-2 py-1"
              value={kind}
              onChange={(e) => setKind(e.target.value)}
            >
              <option value="">any</option>
              <option value="mordant-bath">mordant bath</option>
              <option value="print-paste">print paste</option>
              <option value="dye-bath">dye bath</option>
              <option value="vat">vat</option>
              <option value="stock">stock</option>
            </select>
          </label>
        </div>
        {all.isError ? (
          <p role="alert">{all.error.message}</p>
        ) : all.data ? (
          <BathTable items={all.data.items} label="All baths" />
        ) : (
          <p>Loading…</p>
        )}
      </section>
    </Page>
  );
}
