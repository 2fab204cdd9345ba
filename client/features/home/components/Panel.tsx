import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';

/** One section of a home page: a heading (with its count and a link to the full list), then its rows or a word why none. */
export function Panel({
  title,
  total,
  more,
  children,
  testId,
}: {
  title: string;
  total?: number;
  more?: { to: string; label: string };
  children: ReactNode;
  testId: string;
}) {
  return (
    <section className="min-w-0 rounded-lg border border-rule bg-sheet p-4" data-testid={testId} aria-label={title}>
      <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
        <h2 className="text-lg font-semibold">
          {title}
          {total !== undefined ? <span className="ml-2 text-sm font-normal text-ink-soft num">{total}</span> : null}
        </h2>
        {more ? (
          <Link to={more.to} className="text-sm text-action hover:underline">
            {more.label}
          </Link>
        ) : null}
      </div>
      {children}
    </section>
  );
}

export function Rows({ children }: { children: ReactNode }) {
  return <ul className="space-y-2 text-sm">{children}</ul>;
}

export function Empty({ children }: { children: ReactNode }) {
  return <p className="text-sm text-ink-soft">{children}</p>;
}
