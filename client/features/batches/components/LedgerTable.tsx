import { EVENT_LABELS } from './EventForms';
import { Link } from 'react-router-dom';
import { paths } from '../../../paths';
import type { BatchDetail } from '../api';

const describe = (e: BatchDetail['events'][number]) => {
  const parts = [
    e.additions?.length ? e.additions.map((a) => `${a.name} ${a.grams} g`).join(', ') : null,
    e.ph != null ? `pH ${e.ph}` : null,
    e.result,
    e.route ? `route: ${e.route}` : null,
    e.ruleFollowed ? `rule: ${e.ruleFollowed}` : null,
    e.notes,
  ];
  return parts.filter(Boolean).join(' · ');
};

export function LedgerTable({ batch }: { batch: BatchDetail }) {
  const after = new Map(batch.timeline.map((p) => [p.eventId, p]));
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm" aria-label="Ledger">
        <thead className="text-left text-ink-soft border-b border-rule">
          <tr>
            <th className="py-2 pr-3">Date</th>
            <th className="pr-3">Event</th>
            <th className="pr-3 text-right">Volume (mL)</th>
            <th className="pr-3 text-right">Fibre (g)</th>
            <th className="pr-3">Trial</th>
            <th className="pr-3 text-right">Left after (mL)</th>
            <th>Details</th>
          </tr>
        </thead>
        <tbody className="num">
          <tr className="border-b border-rule">
            <td className="py-1.5 pr-3">{batch.madeOn}</td>
            <td className="pr-3">made</td>
            <td className="pr-3 text-right">{batch.volumeMl}</td>
            <td colSpan={2} />
            <td className="pr-3 text-right">{batch.volumeMl}</td>
            <td />
          </tr>
          {batch.events.map((e) => (
            <tr key={e.id} className="border-b border-rule align-top">
              <td className="py-1.5 pr-3">{e.occurredAt.slice(0, 10)}</td>
              <td className="pr-3">{EVENT_LABELS[e.type as keyof typeof EVENT_LABELS] ?? e.type}</td>
              <td className="pr-3 text-right">
                {e.volumeMl == null ? '' : e.type === 'use' ? `−${e.volumeMl}` : `+${e.volumeMl}`}
              </td>
              <td className="pr-3 text-right">{e.fibreMassG ?? ''}</td>
              <td className="pr-3">
                {e.trialId ? (
                  <Link className="text-action underline" to={paths.trial(e.trialId)}>
                    {e.trialCode ?? `trial ${e.trialId}`}
                  </Link>
                ) : (
                  ''
                )}
              </td>
              <td className="pr-3 text-right">{after.get(e.id)?.remainingMl ?? ''}</td>
              <td className="font-sans">{describe(e)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
