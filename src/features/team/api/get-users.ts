import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { teamKeys } from './keys';

export type Role = 'reviewer' | 'engineer' | 'admin';
export const ROLES: readonly Role[] = ['reviewer', 'engineer', 'admin'];

export interface TeamUser {
  id: number;
  email: string;
  name: string;
  role: Role;
  disabled: boolean;
  createdAt: string;
}

export const getUsers = async (signal?: AbortSignal) => (await api<{ users: TeamUser[] }>('/api/users', { signal })).users;

export const usersQueryOptions = () => queryOptions({ queryKey: teamKeys.users(), queryFn: ({ signal }) => getUsers(signal) });

export const useUsers = () => useQuery(usersQueryOptions());
