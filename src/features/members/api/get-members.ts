import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { memberSchema } from '@shared/api/notebooks.ts';
import { api } from '@/lib/api-client.ts';

const membersResponseSchema = z.object({ members: z.array(memberSchema) });

export const getMembers = (notebookId: string) =>
  api
    .get(`/api/notebooks/${encodeURIComponent(notebookId)}/members`, membersResponseSchema)
    .then((r) => r.members);

export const getMembersQueryOptions = (notebookId: string) =>
  queryOptions({ queryKey: ['members', notebookId], queryFn: () => getMembers(notebookId) });

export const useMembers = (notebookId: string) => useQuery(getMembersQueryOptions(notebookId));
