import { useEffect } from 'react';

/** Each page names itself in the tab, history and bookmarks: "1931.4.12 — Tinctoria". */
export function useDocumentTitle(title: string | null | undefined) {
  useEffect(() => {
    document.title = title ? `${title} — Tinctoria` : 'Tinctoria';
  }, [title]);
}
