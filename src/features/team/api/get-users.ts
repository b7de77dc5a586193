import { queryOptions, useQuery } from '@tanstack/react-query';
import { userListReply } from '../../../../shared/contract/people';
import { apiReply } from '../../../lib/api';
import { teamKeys } from './keys';

export { ROLES, type PublicUser as TeamUser, type Role } from '../../../../shared/contract/people';

export const getUsers = async (signal?: AbortSignal) => (await apiReply(userListReply, '/api/users', { signal })).users;

export const usersQueryOptions = () => queryOptions({ queryKey: teamKeys.users(), queryFn: ({ signal }) => getUsers(signal) });

export const useUsers = () => useQuery(usersQueryOptions());
