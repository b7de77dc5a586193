import { queryOptions, useQuery } from '@tanstack/react-query';
import { userListReply, type Role } from '../../../../shared/contract/people';
import { apiReply } from '../../../lib/api';
import { teamKeys } from './keys';

export type { PublicUser as TeamUser, Role } from '../../../../shared/contract/people';
export const ROLES: readonly Role[] = ['reviewer', 'engineer', 'admin'];



export const getUsers = async (signal?: AbortSignal) => (await apiReply(userListReply, '/api/users', { signal })).users;

export const usersQueryOptions = () => queryOptions({ queryKey: teamKeys.users(), queryFn: ({ signal }) => getUsers(signal) });

export const useUsers = () => useQuery(usersQueryOptions());
