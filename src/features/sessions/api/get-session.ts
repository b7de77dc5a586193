import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { sessionKeys } from './session-keys';
import type { SessionRecord } from './session-types';

export const getSession = async (id: number, signal?: AbortSignal) => (await api<{ session: SessionRecord }>(`/api/sessions/${id}`, { signal })).session;

export const sessionQueryOptions = (id: number) => queryOptions({ queryKey: sessionKeys.detail(id), queryFn: ({ signal }) => getSession(id, signal) });

export const useSession = (id: number) => useQuery(sessionQueryOptions(id));
