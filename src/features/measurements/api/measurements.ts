import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { measurementSetListSchema, measurementSetSchema, type ImportMeasurementsInput } from '@shared/api/measurements.ts';
import { api } from '@/lib/api-client.ts';

const path = (notebookId: string, entryId: string) => `/api/notebooks/${encodeURIComponent(notebookId)}/entries/${encodeURIComponent(entryId)}/measurements`;

export const getMeasurementsQueryOptions = (notebookId: string, entryId: string) =>
  queryOptions({ queryKey: ['measurements', notebookId, entryId], queryFn: () => api.get(path(notebookId, entryId), measurementSetListSchema) });

export const useMeasurements = (notebookId: string, entryId: string) => useQuery(getMeasurementsQueryOptions(notebookId, entryId));

export function useImportMeasurements(notebookId: string, entryId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ImportMeasurementsInput) => api.post(path(notebookId, entryId), input, measurementSetSchema),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getMeasurementsQueryOptions(notebookId, entryId).queryKey }),
  });
}
