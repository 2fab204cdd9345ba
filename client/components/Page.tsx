import { useDocumentTitle } from '../lib/title';
import type { ReactNode } from 'react';

export function Page({
  title,
  documentTitle,
  lead,
  actions,
  children,
}: {
  title: string;
  /** The tab's title when it should differ from the heading (a piece is named by its accession number). */
  documentTitle?: string;
  lead?: ReactNode;
  actions?: ReactNode;
  children?: ReactNode;
}) {
  useDocumentTitle(documentTitle ?? title);
  return (
    <section>
      <div className="flex flex-wrap items-end justify-between gap-4 mb-6">
        <div>
          <h1 className="text-3xl font-semibold text-ink">{title}</h1>
          {lead ? <p className="mt-1 text-ink-soft max-w-3xl">{lead}</p> : null}
        </div>
        {actions ? <div className="flex flex-wrap items-center gap-2">{actions}</div> : null}
      </div>
      {children}
    </section>
  );
}
