import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import { requestResetSchema } from '@shared/api/auth.ts';
import { apiRequest } from '@/lib/api-client.ts';

export { requestResetSchema };

/** Always answers 202, whether or not the address is known. */
export function requestPasswordReset(input: z.output<typeof requestResetSchema>) {
  return apiRequest('/api/auth/password-reset', { method: 'POST', body: input, on401: 'return' });
}

export const useRequestPasswordReset = () => useMutation({ mutationFn: requestPasswordReset });
