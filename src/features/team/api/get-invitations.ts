import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import type { Role } from './get-users';
import { teamKeys } from './keys';

export interface Invitation {
  id: number;
  email: string;
  /** Who it is for, as the admin wrote it; the invitee chooses their own account name. */
  name: string | null;
  role: Role;
  expiresAt: string;
  usedAt: string | null;
  invitedById: number | null;
  createdAt: string;
}

export const getInvitations = async (signal?: AbortSignal) => (await api<{ invitations: Invitation[] }>('/api/invitations', { signal })).invitations;

export const invitationsQueryOptions = () => queryOptions({ queryKey: teamKeys.invitations(), queryFn: ({ signal }) => getInvitations(signal) });

export const useInvitations = () => useQuery(invitationsQueryOptions());
