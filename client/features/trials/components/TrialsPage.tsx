import { useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import {
  TRIAL_KINDS,
  TRIAL_STATUSES,
  trialListQuerySchema,
  type TrialListQuery,
} from '../../../../shared/schemas/trial';
import { useFormErrors } from '../../../lib/form';
import { Page } from '../../../components/Page';
import { useCan } from '../../auth';
import { paths } from '../../../paths';
import { useTrials } from '../api';
import { fmt, STATUS_WORDS } from '../format';
import { DownloadLink } from '../../export';
import { exportUrls } from '../../export';
import { Swatch } from './Swatch';
import { viewingLabel } from '../../../../shared/colour/conditions';
import { VerdictBadge } from './VerdictBadge';

const select = 'mt-1 block rounded-md border border-rule-strong bg-sheet px-3 py-2 text-sm';

/** /trials: every trial, newest code first, filtered from the address bar so a view can be shared. */
export function TrialsPage() {
  const [params, setParams] = useSearchParams();
  const can = useCan();
  const q: TrialListQuery = {
    q: params.get('q') ?? undefined,
    status: (params.get('status') as TrialListQuery['status']) ?? undefined,
    kind: (params.get('kind') as TrialListQuery['kind']) ?? undefined,
    mine: params.get('mine') === '1' ? '1' : undefined,
    page: Number(params.get('page') ?? 1) || 1,
    pageSize: 25,
  };
  const page = Number(q.page);
  const [text, setText] = useState(q.q ?? '');
  const words = useFormErrors();
  const list = useTrials(q);
  const set = (k: string, v: string) => {
    const next = new URLSearchParams(params);
    if (v) next.set(k, v);
    else next.delete(k);
    if (k !== 'page') next.delete('page');
    setParams(next);
  };
  const pages = list.data ? Math.max(1, Math.ceil(list.data.total / list.data.pageSize)) : 1;

  return (
    <Page
      title="Trials"
      lead="Reproduction trials: recipes, the safer chemistry that replaced historical mordants, and how close each result came to its original."
      actions={
        <>
          {can('trial:read') ? (
            <DownloadLink
              href={exportUrls.trialsCsv()}
              hint="Every trial as a CSV spreadsheet: recipe, target and result L*a*b* with their viewing conditions, ΔE00, CMC(2:1), verdict and fastness grades"
            >
              Export trials (CSV)
            </DownloadLink>
          ) : null}
          {can('trial:create') ? (
            <Link
              className="rounded-md bg-action px-4 py-2 text-sm font-medium text-white hover:bg-action-strong"
              to={paths.trialNew()}
            >
              New trial
            </Link>
          ) : null}
        </>
      }
    >
      <form
        ref={words.formRef}
        noValidate
        className="mb-4 flex flex-wrap items-end gap-3"
        role="search"
        onSubmit={(e) => {
          e.preventDefault();
          // The list's shared query schema checks the words (their length) before they reach the address bar.
          if (words.check(trialListQuerySchema, { ...q, q: text.trim() || undefined })) set('q', text.trim());
        }}
      >
        <div>
          <label className="text-sm font-medium">
            Words
            <input
              className={`${words.errors.q ? select.replace('border-rule-strong', 'border-danger') : select} w-56`}
              value={text}
              onChange={(e) => setText(e.target.value)}
              placeholder="code, notes, accession number"
              aria-invalid={words.errors.q ? true : undefined}
              aria-describedby={words.errors.q ? 'trials-q-err' : undefined}
            />
          </label>
          {words.errors.q ? (
            <p id="trials-q-err" className="mt-1 w-56 text-sm text-danger">
              {words.errors.q.join(' ')}
            </p>
          ) : null}
        </div>
        <label className="text-sm font-medium">
          Status
          <select className={select} value={q.status ?? ''} onChange={(e) => set('status', e.target.value)}>
            <option value="">any</option>
            {TRIAL_STATUSES.map((s) => (
              <option key={s} value={s}>
                {STATUS_WORDS[s]}
              </option>
            ))}
          </select>
        </label>
        <label className="text-sm font-medium">
          Kind
          <select className={select} value={q.kind ?? ''} onChange={(e) => set('kind', e.target.value)}>
            <option value="">any</option>
            {TRIAL_KINDS.map((k) => (
              <option key={k} value={k}>
                {k === 'modern' ? 'Modern trial' : 'Historical record'}
              </option>
            ))}
          </select>
        </label>
        <label className="flex items-center gap-2 pb-2 text-sm">
          <input type="checkbox" checked={q.mine === '1'} onChange={(e) => set('mine', e.target.checked ? '1' : '')} />{' '}
          Only mine
        </label>
        <button className="rounded-md border border-rule-strong bg-sheet px-4 py-2 text-sm" type="submit">
          Search
        </button>
      </form>

      {list.isError ? (
        <p role="alert" className="text-danger">
          {list.error.message}
        </p>
      ) : null}
      {list.isPending ? <p className="text-ink-soft">Loading trials…</p> : null}
      {list.data ? (
        <>
          <p className="mb-2 text-sm text-ink-soft">
            {list.data.total} trial{list.data.total === 1 ? '' : 's'}
          </p>
          <div className="overflow-x-auto rounded-lg border border-rule bg-sheet">
            <table className="w-full text-sm">
              <thead className="bg-paper text-left text-ink-soft">
                <tr>
                  <th className="px-3 py-2">Code</th>
                  <th className="px-3 py-2">Piece</th>
                  <th className="px-3 py-2">Dyer</th>
                  <th className="px-3 py-2">Status</th>
                  <th className="px-3 py-2">Result</th>
                  <th className="px-3 py-2 text-right">ΔE00</th>
                  <th className="px-3 py-2">Verdict</th>
                </tr>
              </thead>
              <tbody>
                {list.data.items.map((t) => (
                  <tr key={t.id} className="border-t border-rule">
                    <td className="px-3 py-2 font-mono">
                      <Link className="text-action underline" to={paths.trial(t.id)}>
                        {t.code}
                      </Link>
                      {t.kind === 'historical' ? <span className="ml-2 text-xs text-ink-faint">historical</span> : null}
                    </td>
                    <td className="px-3 py-2">
                      {t.piece ? (
                        <Link className="underline" to={paths.piece(t.piece.id)}>
                          <span className="font-mono">{t.piece.accessionNumber}</span>
                        </Link>
                      ) : (
                        <span className="text-ink-faint">—</span>
                      )}
                    </td>
                    <td className="px-3 py-2">{t.dyer?.name ?? '—'}</td>
                    <td className="px-3 py-2">{STATUS_WORDS[t.status as keyof typeof STATUS_WORDS]}</td>
                    <td className="px-3 py-2">
                      <Swatch
                        size="sm"
                        label={`${t.code} result${t.colour?.result ? `, ${viewingLabel(t.colour.result)}` : ''}`}
                        colour={t.colour?.result ?? null}
                        shadeLink
                      />
                    </td>
                    <td className="px-3 py-2 text-right font-mono">
                      {t.colour?.difference ? (
                        <>
                          {fmt(t.colour.difference.deltaE00, 2)}
                          {t.colour.conditions ? (
                            <span className="block font-sans text-xs text-ink-faint">
                              {t.colour.conditions.illuminant}
                              {t.colour.conditions.observersDiffer ? ', observers differ' : ''}
                            </span>
                          ) : null}
                        </>
                      ) : (
                        // Say why there is no figure: nothing measured yet, no original colour, or no reading under the original's illuminant.
                        <span className="font-sans text-xs text-ink-faint" title={t.colour?.missing?.message}>
                          {t.colour?.missing && t.colour.results.length
                            ? `no reading under ${t.colour.missing.illuminant}`
                            : t.colour?.result
                              ? 'no original colour'
                              : 'no result yet'}
                        </span>
                      )}
                    </td>
                    <td className="px-3 py-2">
                      {t.colour?.difference ? (
                        <VerdictBadge verdict={t.colour.difference.verdict} />
                      ) : (
                        <span className="text-ink-faint">—</span>
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          {pages > 1 ? (
            <nav aria-label="Pages" className="mt-3 flex items-center gap-3 text-sm">
              <button
                disabled={page <= 1}
                className="underline disabled:opacity-40"
                onClick={() => set('page', String(page - 1))}
              >
                Previous
              </button>
              <span>
                Page {page} of {pages}
              </span>
              <button
                disabled={page >= pages}
                className="underline disabled:opacity-40"
                onClick={() => set('page', String(page + 1))}
              >
                Next
              </button>
            </nav>
          ) : null}
        </>
      ) : null}
    </Page>
  );
}
