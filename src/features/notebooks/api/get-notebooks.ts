import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { notebookSummarySchema } from '@shared/api/notebooks.ts';
import { api } from '@/lib/api-client.ts';

const notebooksResponseSchema = z.object({ notebooks: z.array(notebookSummarySchema) });

/** Only the notebooks the caller belongs to. */
export const getNotebooks = () => api.get('/api/notebooks', notebooksResponseSchema).then((r) => r.notebooks);

export const getNotebooksQueryOptions = () =>
  queryOptions({ queryKey: ['notebooks'], queryFn: getNotebooks });

export const useNotebooks = () => useQuery(getNotebooksQueryOptions());
