import { useQueryClient, type QueryClient } from '@tanstack/react-query';

/** Starts one query of a page: `(qc) => qc.prefetchQuery(getEntryQueryOptions(n, e))`. */
export type Prefetcher = (qc: QueryClient) => Promise<void>;

/** Handlers that start loading a link's page when the pointer rests on it or it takes focus. */
export interface IntentHandlers {
  onMouseEnter: () => void;
  onFocus: () => void;
}

/**
 * Prefetch on intent: returns a function that, given the queries a link's page reads (each as
 * `qc.prefetchQuery` of that query's own `queryOptions`), gives the link handlers that run them on
 * hover or focus. Data still fresh (within the client's stale time) is not fetched again.
 */
export function usePrefetchOnIntent(): (...queries: Prefetcher[]) => IntentHandlers {
  const qc = useQueryClient();
  return (...queries) => {
    const go = () => {
      for (const q of queries) void q(qc);
    };
    return { onMouseEnter: go, onFocus: go };
  };
}
