import { queryOptions, useQuery } from '@tanstack/react-query';
import { notebookSchema } from '@shared/api/notebooks.ts';
import { api } from '@/lib/api-client.ts';
import { getNotebooksQueryOptions } from './get-notebooks.ts';

/** 404 both when it doesn't exist and when the caller isn't a member. */
export const getNotebook = (id: string) =>
  api.get(`/api/notebooks/${encodeURIComponent(id)}`, notebookSchema);

export const getNotebookQueryOptions = (id: string) =>
  queryOptions({ queryKey: [...getNotebooksQueryOptions().queryKey, id], queryFn: () => getNotebook(id) });

export const useNotebook = (id: string) => useQuery(getNotebookQueryOptions(id));
