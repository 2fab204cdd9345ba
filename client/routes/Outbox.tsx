import { formatDateTime } from '../../shared/format';
import { useState } from 'react';
import { Page } from '../components/Page';
import { Button } from '../components/Button';
import { useOutbox } from '../features/outbox/api';
import { ApiError } from '../lib/http';
import { NotFound } from './NotFound';

const URL_IN_TEXT = /(https?:\/\/[^\s<>"]+[^\s<>".,;:!?)])/g;

/** The message text with its links clickable, as a mail program shows them. */
function Linked({ text }: { text: string }) {
  return text.split(URL_IN_TEXT).map((part, i) =>
    i % 2 ? (
      <a key={i} href={part} className="text-action underline break-all">
        {part}
      </a>
    ) : (
      part
    ),
  );
}

/** Mail caught by the local SMTP catcher; the server offers it only outside production. */
export function Outbox() {
  const [page, setPage] = useState(1);
  const outbox = useOutbox(page);
  if (outbox.error instanceof ApiError && outbox.error.status === 404)
    return (
      <NotFound
        title="No local outbox here"
        text="This server sends mail through a real relay, so there is no local outbox to show."
      />
    );
  const data = outbox.data;
  const pages = data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1;
  return (
    <Page
      title="Local outbox"
      lead="Every message the app sent on this development or test server, newest first. Nothing here left the machine."
    >
      {outbox.isPending ? <p className="text-ink-soft">Loading…</p> : null}
      {outbox.error ? (
        <p role="alert" className="text-danger">
          {outbox.error.message}
        </p>
      ) : null}
      {data && data.items.length === 0 ? <p className="text-ink-soft">No mail yet.</p> : null}
      <ul className="space-y-3">
        {data?.items.map((m) => (
          <li key={m.id} className="rounded-lg border border-rule bg-sheet">
            <details>
              <summary className="cursor-pointer px-4 py-3">
                <span className="font-medium">{m.subject}</span>
                <span className="ml-2 text-sm text-ink-soft">to {m.to.join(', ')}</span>
                {m.date ? (
                  <time className="ml-2 text-xs text-ink-faint num" dateTime={m.date}>
                    {formatDateTime(m.date)}
                  </time>
                ) : null}
              </summary>
              <pre className="whitespace-pre-wrap border-t border-rule px-4 py-3 font-mono text-xs">
                <Linked text={m.text} />
              </pre>
            </details>
          </li>
        ))}
      </ul>
      {pages > 1 ? (
        <div className="mt-4 flex items-center gap-3 text-sm">
          <Button variant="secondary" disabled={page <= 1} onClick={() => setPage(page - 1)}>
            Newer
          </Button>
          <span className="num">
            Page {page} of {pages}
          </span>
          <Button variant="secondary" disabled={page >= pages} onClick={() => setPage(page + 1)}>
            Older
          </Button>
        </div>
      ) : null}
    </Page>
  );
}
