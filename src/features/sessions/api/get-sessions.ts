import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { sessionListQueryOptions } from '../../../lib/resources/sessions';
import { filtersToListParams, type SessionFilters } from '../list/session-filters';

export const sessionsQueryOptions = (filters: SessionFilters) => sessionListQueryOptions(filtersToListParams(filters));

/** One page of sessions; the previous page stays on screen while the next one loads. */
export const useSessions = (filters: SessionFilters) => useQuery({ ...sessionsQueryOptions(filters), placeholderData: keepPreviousData });
