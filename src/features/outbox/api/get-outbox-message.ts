import { queryOptions, useQuery } from '@tanstack/react-query';
import { outboxMessageSchema } from '@shared/api/outbox.ts';
import { api } from '@/lib/api-client.ts';
import { getOutboxQueryOptions } from './get-outbox.ts';

export const getOutboxMessage = (id: string) =>
  api.get(`/api/dev/outbox/${encodeURIComponent(id)}`, outboxMessageSchema, { on401: 'return' });

export const getOutboxMessageQueryOptions = (id: string) =>
  queryOptions({
    queryKey: [...getOutboxQueryOptions().queryKey, id],
    queryFn: () => getOutboxMessage(id),
    refetchInterval: false,
  });

export const useOutboxMessage = (id: string) => useQuery(getOutboxMessageQueryOptions(id));
