import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { acceptInviteSchema, meResponseSchema } from '@shared/api/auth.ts';
import { apiRequest } from '@/lib/api-client.ts';
import { startSession } from './get-me.ts';

export { acceptInviteSchema };

/** Sets the password for an invited person and signs them in. */
export function acceptInvite({ token, ...body }: z.output<typeof acceptInviteSchema> & { token: string }) {
  return apiRequest(`/api/invites/${encodeURIComponent(token)}/accept`, {
    method: 'POST',
    body,
    schema: meResponseSchema,
    on401: 'return',
  });
}

export function useAcceptInvite() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: acceptInvite,
    onSuccess: (me) => startSession(qc, me),
  });
}
