import { useMutation, useQueryClient } from '@tanstack/react-query';
import { meResponseSchema, signInSchema, type SignInInput } from '@shared/api/auth.ts';
import { apiRequest } from '@/lib/api-client.ts';
import { startSession } from './get-me.ts';

export { signInSchema };

export function signIn(input: SignInInput) {
  return apiRequest('/api/auth/sign-in', {
    method: 'POST',
    body: input,
    schema: meResponseSchema,
    on401: 'return',
  });
}

export function useSignIn() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (me) => startSession(qc, me),
  });
}
