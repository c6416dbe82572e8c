import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { figureListSchema, figureSchema, type AttachFigureInput } from '@shared/api/figures.ts';
import { api } from '@/lib/api-client.ts';

const figuresPath = (notebookId: string, entryId: string) => `/api/notebooks/${encodeURIComponent(notebookId)}/entries/${encodeURIComponent(entryId)}/figures`;

export const getFiguresQueryOptions = (notebookId: string, entryId: string) =>
  queryOptions({ queryKey: ['figures', notebookId, entryId], queryFn: () => api.get(figuresPath(notebookId, entryId), figureListSchema) });

export const useFigures = (notebookId: string, entryId: string) => useQuery(getFiguresQueryOptions(notebookId, entryId));

/** Asks the server to render the cell's plot (SVG and PNG) and keep it as a figure of the revision. */
export const attachFigure = (notebookId: string, entryId: string, input: AttachFigureInput) => api.post(figuresPath(notebookId, entryId), input, figureSchema);

export function useAttachFigure(notebookId: string, entryId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: AttachFigureInput) => attachFigure(notebookId, entryId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getFiguresQueryOptions(notebookId, entryId).queryKey }),
  });
}
