import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Page } from '../../../components/Page';
import { paths } from '../../../paths';
import { useCan } from '../../auth';
import { useSeriesList } from '../api';
import { NewSeriesForm } from './NewSeriesForm';

export function SeriesListPage() {
  const q = useSeriesList();
  const can = useCan();
  const [adding, setAdding] = useState(false);
  return (
    <Page
      title="Series"
      lead="Plan a matrix of dyestuffs, mordants and strengths, or a workshop card, and create its trials in one go."
      actions={
        can('series:create') ? (
          <button className="rounded-md bg-action px-4 py-2 text-sm text-white" onClick={() => setAdding((a) => !a)}>
            {adding ? 'Close' : 'Plan a series'}
          </button>
        ) : null
      }
    >
      {adding ? <NewSeriesForm /> : null}
      {q.isError ? (
        <p role="alert">{q.error.message}</p>
      ) : !q.data ? (
        <p>Loading…</p>
      ) : (
        // Six columns do not fit a phone: the table scrolls in its own box, not the page.
        <div className="relative overflow-x-auto">
          <table className="w-full text-sm" aria-label="Series">
            <thead className="text-left text-ink-soft border-b border-rule">
              <tr>
                <th className="py-2 pr-3">Code</th>
                <th className="pr-3">Title</th>
                <th className="pr-3">Kind</th>
                <th className="pr-3 text-right">Cells kept</th>
                <th className="pr-3 text-right">Participants</th>
                <th>Held on</th>
              </tr>
            </thead>
            <tbody>
              {q.data.items.map((s) => (
                <tr key={s.id} className="border-b border-rule">
                  <td className="py-1.5 pr-3 whitespace-nowrap">
                    <Link className="text-action underline" to={paths.seriesOne(s.id)}>
                      {s.code}
                    </Link>
                  </td>
                  <td className="pr-3">{s.title}</td>
                  <td className="pr-3">{s.kind}</td>
                  <td className="pr-3 text-right num">{s.cellCount}</td>
                  <td className="pr-3 text-right num">{s.participantCount}</td>
                  <td className="num">{s.heldOn ?? '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </Page>
  );
}
