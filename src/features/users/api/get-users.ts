import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { userSchema } from '@shared/api/users.ts';
import { api } from '@/lib/api-client.ts';

const usersResponseSchema = z.object({ users: z.array(userSchema) });

/** GET /api/users (administrator): every account on the site. */
export const getUsers = () => api.get('/api/users', usersResponseSchema).then((r) => r.users);

export const getUsersQueryOptions = () => queryOptions({ queryKey: ['users'], queryFn: getUsers });

export const useUsers = () => useQuery(getUsersQueryOptions());
