import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import { completeResetSchema } from '@shared/api/auth.ts';
import { apiRequest } from '@/lib/api-client.ts';

export { completeResetSchema };

export function completePasswordReset(input: z.output<typeof completeResetSchema>) {
  return apiRequest('/api/auth/password-reset/complete', { method: 'POST', body: input, on401: 'return' });
}

export const useCompletePasswordReset = () => useMutation({ mutationFn: completePasswordReset });
