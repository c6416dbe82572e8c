import { useMutation, useQueryClient } from '@tanstack/react-query';
import { updateUserSchema, userSchema, type UpdateUserInput } from '@shared/api/users.ts';
import { api } from '@/lib/api-client.ts';
import { getUsersQueryOptions } from './get-users.ts';

export { updateUserSchema };

/** PATCH /api/users/:id (administrator): change site role or deactivate. */
export const updateUser = ({ id, ...input }: UpdateUserInput & { id: string }) =>
  api.patch(`/api/users/${encodeURIComponent(id)}`, updateUserSchema.parse(input), userSchema);

export function useUpdateUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSettled: () => qc.invalidateQueries({ queryKey: getUsersQueryOptions().queryKey }),
  });
}
