import { useMutation, useQueryClient } from '@tanstack/react-query';
import { createInviteSchema, inviteSchema, type CreateInviteInput } from '@shared/api/auth.ts';
import { api } from '@/lib/api-client.ts';
import { getInvitesQueryOptions } from './get-invites.ts';

export { createInviteSchema };

/** Administrator only: mails a link that lets the person set a password. */
export const createInvite = (input: CreateInviteInput) => api.post('/api/invites', input, inviteSchema);

export function useCreateInvite() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createInvite,
    onSuccess: () => qc.invalidateQueries({ queryKey: getInvitesQueryOptions().queryKey }),
  });
}
