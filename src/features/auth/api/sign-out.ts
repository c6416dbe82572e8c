import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api-client.ts';
import { startSession } from './get-me.ts';

export function signOut() {
  return apiRequest('/api/auth/sign-out', { method: 'POST', on401: 'return' });
}

export function useSignOut() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSettled: () => startSession(qc, null),
  });
}
