import { Link, useParams } from 'react-router-dom';
import { Page } from '../../../components/Page';
import { paths } from '../../../paths';
import { useCan } from '../../auth';
import { usePieceTrials } from '../api';
import { fmt, STATUS_WORDS } from '../format';
import { ColourComparison } from './ColourComparison';

/** /archive/:id/side-by-side: the original's colour beside every trial's result, closest first. */
export function SideBySidePage() {
  const pieceId = Number(useParams().id);
  const q = usePieceTrials(pieceId);
  const can = useCan();
  if (q.isPending) return <p className="py-10 text-ink-soft">Loading…</p>;
  if (q.isError)
    return (
      <p role="alert" className="text-danger">
        {q.error.message}
      </p>
    );
  const rank = (d: number | undefined) => d ?? Number.POSITIVE_INFINITY;
  const items = [...q.data.items].sort(
    (x, y) =>
      rank(x.colour?.difference?.deltaE00) - rank(y.colour?.difference?.deltaE00) || x.code.localeCompare(y.code),
  );
  return (
    <Page
      title="Side by side"
      lead={
        <>
          Every trial of{' '}
          <Link className="underline" to={paths.piece(pieceId)}>
            <span className="font-mono">{q.data.piece.accessionNumber}</span> {q.data.piece.title}
          </Link>{' '}
          beside its target, closest (lowest ΔE00) first. Each comparison is made under one illuminant, named beside its
          figures.
        </>
      }
      actions={
        can('trial:create') ? (
          <Link
            className="rounded-md bg-action px-4 py-2 text-sm font-medium text-white hover:bg-action-strong"
            to={paths.trialNew(pieceId)}
          >
            Attach a trial
          </Link>
        ) : null
      }
    >
      {items.length === 0 ? (
        <p className="text-ink-soft">No trials reproduce this piece yet.</p>
      ) : (
        <ol className="space-y-6">
          {items.map((t) => (
            <li key={t.id} className="rounded-lg border border-rule bg-sheet p-4">
              <h2 className="mb-3 text-lg font-semibold">
                <Link className="font-mono text-action underline" to={paths.trial(t.id)}>
                  {t.code}
                </Link>
                <span className="ml-2 text-sm font-normal text-ink-soft">
                  {STATUS_WORDS[t.status]} · {t.dyer?.name ?? '—'}
                  {t.colour?.difference && t.colour.conditions
                    ? ` · ΔE00 ${fmt(t.colour.difference.deltaE00, 2)} under ${t.colour.conditions.illuminant}`
                    : t.colour?.missing && t.colour.results.length
                      ? ` · no ΔE00: no reading under ${t.colour.missing.illuminant}`
                      : ''}
                </span>
              </h2>
              {t.notes ? <p className="mb-3 text-sm text-ink-soft">{t.notes}</p> : null}
              {t.colour ? <ColourComparison colour={t.colour} large /> : null}
            </li>
          ))}
        </ol>
      )}
    </Page>
  );
}
