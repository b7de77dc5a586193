import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';

export type Role = 'reviewer' | 'engineer' | 'admin';

export interface PublicUser {
  id: number;
  email: string;
  name: string;
  role: Role;
  disabled: boolean;
  createdAt: string;
}

export const authKeys = { all: ['auth'] as const, me: () => [...authKeys.all, 'me'] as const };

/** Who is signed in, or null when nobody is (answered 200, so a signed-out visit logs no error). */
export async function getMe(signal?: AbortSignal): Promise<PublicUser | null> {
  return (await api<{ user: PublicUser | null }>('/api/auth/current', { signal })).user;
}

export const meQueryOptions = () =>
  queryOptions({ queryKey: authKeys.me(), queryFn: ({ signal }) => getMe(signal), staleTime: 60_000 });

export const useMe = () => useQuery(meQueryOptions());
