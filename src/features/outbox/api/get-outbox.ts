import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { outboxMessageSummarySchema } from '@shared/api/outbox.ts';
import { api } from '@/lib/api-client.ts';

const outboxResponseSchema = z.object({ messages: z.array(outboxMessageSummarySchema) });

/** Newest first. Exists only in development and demo installations. */
export const getOutbox = () =>
  api.get('/api/dev/outbox', outboxResponseSchema, { on401: 'return' }).then((r) => r.messages);

export const getOutboxQueryOptions = () =>
  queryOptions({ queryKey: ['outbox'], queryFn: getOutbox, refetchInterval: 5000 });

export const useOutbox = () => useQuery(getOutboxQueryOptions());

/** Whether this installation has a local outbox (development and demo only): a 404 means no. */
export const getOutboxAvailableQueryOptions = () =>
  queryOptions({
    queryKey: [...getOutboxQueryOptions().queryKey, 'available'],
    queryFn: () =>
      getOutbox().then(
        () => true,
        () => false,
      ),
    staleTime: Infinity,
  });

export const useOutboxAvailable = () => useQuery(getOutboxAvailableQueryOptions());
