import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { updateAccountSchema, userSchema } from '@shared/api/users.ts';
import { apiRequest } from '@/lib/api-client.ts';
import { getMeQueryOptions } from './get-me.ts';

export { updateAccountSchema };

/** PATCH /api/account: the signed-in person changes their own display name. */
export function updateAccount(input: z.output<typeof updateAccountSchema>) {
  return apiRequest('/api/account', { method: 'PATCH', body: input, schema: userSchema });
}

export function useUpdateAccount() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateAccount,
    onSuccess: () => qc.invalidateQueries({ queryKey: getMeQueryOptions().queryKey }),
  });
}
