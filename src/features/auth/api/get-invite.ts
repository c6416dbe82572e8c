import { queryOptions, useQuery } from '@tanstack/react-query';
import { inviteLookupSchema } from '@shared/api/auth.ts';
import { apiRequest } from '@/lib/api-client.ts';

/** Who an invite link is for (404 when unknown, used or expired). */
export function getInvite(token: string) {
  return apiRequest(`/api/invites/${encodeURIComponent(token)}`, {
    schema: inviteLookupSchema,
    on401: 'return',
  });
}

export const getInviteQueryOptions = (token: string) =>
  queryOptions({
    queryKey: ['invites', 'lookup', token],
    queryFn: () => getInvite(token),
    staleTime: Infinity,
  });

export const useInvite = (token: string) => useQuery(getInviteQueryOptions(token));
