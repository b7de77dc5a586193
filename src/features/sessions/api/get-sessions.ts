import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { filtersToApiQuery, type SessionFilters } from '../list/session-filters';
import { sessionKeys } from './session-keys';
import type { SessionPage } from './session-types';

export const getSessions = (filters: SessionFilters, signal?: AbortSignal) => api<SessionPage>(`/api/sessions?${filtersToApiQuery(filters)}`, { signal });

export const sessionsQueryOptions = (filters: SessionFilters) =>
  queryOptions({ queryKey: sessionKeys.list(filters), queryFn: ({ signal }) => getSessions(filters, signal) });

/** One page of sessions; the previous page stays on screen while the next one loads. */
export const useSessions = (filters: SessionFilters) => useQuery({ ...sessionsQueryOptions(filters), placeholderData: keepPreviousData });
