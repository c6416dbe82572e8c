import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { inviteSchema } from '@shared/api/auth.ts';
import { api } from '@/lib/api-client.ts';

const invitesResponseSchema = z.object({ invites: z.array(inviteSchema) });

/** Administrator only. */
export const getInvites = () => api.get('/api/invites', invitesResponseSchema).then((r) => r.invites);

export const getInvitesQueryOptions = () => queryOptions({ queryKey: ['invites'], queryFn: getInvites });

export const useInvites = () => useQuery(getInvitesQueryOptions());
