import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiReply } from '../../../lib/api';
import { currentReply, type PublicUser, type Role } from '../../../../shared/contract/people';

export type { PublicUser, Role };

export const authKeys = { all: ['auth'] as const, me: () => [...authKeys.all, 'me'] as const };

/** Who is signed in, or null when nobody is (answered 200, so a signed-out visit logs no error). */
export async function getMe(signal?: AbortSignal): Promise<PublicUser | null> {
  return (await apiReply(currentReply, '/api/auth/current', { signal })).user;
}

export const meQueryOptions = () =>
  queryOptions({ queryKey: authKeys.me(), queryFn: ({ signal }) => getMe(signal), staleTime: 60_000 });

export const useMe = () => useQuery(meQueryOptions());
