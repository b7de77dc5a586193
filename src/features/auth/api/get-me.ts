import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, ApiError } from '../../../lib/api';

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

/** Who is signed in, or null when nobody is (the server answers 401). */
export async function getMe(signal?: AbortSignal): Promise<PublicUser | null> {
  try {
    return (await api<{ user: PublicUser }>('/api/auth/me', { signal })).user;
  } catch (err) {
    if (err instanceof ApiError && err.status === 401) return null;
    throw err;
  }
}

export const meQueryOptions = () =>
  queryOptions({ queryKey: authKeys.me(), queryFn: ({ signal }) => getMe(signal), staleTime: 60_000 });

export const useMe = () => useQuery(meQueryOptions());
