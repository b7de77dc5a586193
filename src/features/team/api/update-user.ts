import { useMutation, useQueryClient } from '@tanstack/react-query';
import { userReply } from '../../../../shared/contract/people';
import { apiReply } from '../../../lib/api';
import type { Role } from './get-users';
import { teamKeys } from './keys';

export type UserChange = { role: Role } | { disabled: boolean };

/** PATCH /api/users/:id (the server refuses to leave the team without an active admin, or an admin locking themselves out). */
export const updateUser = async (id: number, change: UserChange) =>
  (await apiReply(userReply, `/api/users/${id}`, { method: 'PATCH', body: change })).user;

export function useUpdateUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, change }: { id: number; change: UserChange }) => updateUser(id, change),
    // The change is audited too, so the log refreshes with the list.
    onSuccess: () => qc.invalidateQueries({ queryKey: teamKeys.all }),
  });
}
