import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import { meResponseSchema, type MeResponse } from '@shared/api/auth.ts';
import { apiRequest, resetCsrfToken } from '@/lib/api-client.ts';
import { isApiError } from '@/lib/api-error.ts';

/** The signed-in person, or null when nobody is signed in. */
export async function getMe(): Promise<MeResponse | null> {
  try {
    return await apiRequest('/api/auth/me', { schema: meResponseSchema, on401: 'return' });
  } catch (e) {
    if (isApiError(e, 'unauthenticated') || (isApiError(e) && e.status === 401)) return null;
    throw e;
  }
}

export const getMeQueryOptions = () =>
  queryOptions({ queryKey: ['auth', 'me'], queryFn: getMe, staleTime: 60_000 });

export const useMe = () => useQuery(getMeQueryOptions());

/**
 * After signing in, out, or accepting an invite the server starts a new session: the CSRF secret
 * changes and everything cached belonged to the previous person.
 */
export function startSession(qc: QueryClient, me: MeResponse | null): void {
  resetCsrfToken();
  qc.clear();
  qc.setQueryData(getMeQueryOptions().queryKey, me);
}
