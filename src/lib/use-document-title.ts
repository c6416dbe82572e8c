import { useEffect } from 'react';

/** "Page · Bifolio" in the tab, so people and screen readers know where they are. */
export function useDocumentTitle(title: string): void {
  useEffect(() => {
    document.title = title ? `${title} · Bifolio` : 'Bifolio';
  }, [title]);
}
