import type { ReactNode } from 'react';

/** A quiet link to a file the server builds; `download` keeps the user on the page. */
export function DownloadLink({ href, children, hint }: { href: string; children: ReactNode; hint?: string }) {
  return (
    <a
      href={href}
      download
      className="rounded-md border border-rule-strong bg-sheet px-3 py-1.5 text-sm hover:bg-paper"
      title={hint}
    >
      {children}
    </a>
  );
}
