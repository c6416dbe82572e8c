import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import { changePasswordSchema } from '@shared/api/users.ts';
import { apiRequest } from '@/lib/api-client.ts';

export { changePasswordSchema };

/** POST /api/account/password: needs the current password; 400 with a field error when it is wrong. */
export function changePassword(input: z.output<typeof changePasswordSchema>) {
  return apiRequest('/api/account/password', { method: 'POST', body: input });
}

export const useChangePassword = () => useMutation({ mutationFn: changePassword });
