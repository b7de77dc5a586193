import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { LOOKUP_STALE_MS, type BoardRecord } from './lookup-types';
import { lookupKeys } from './session-keys';

/** Every board, for the list's filter. */
export const boardsQueryOptions = () =>
  queryOptions({ queryKey: lookupKeys.boards(), queryFn: async ({ signal }) => (await api<{ boards: BoardRecord[] }>('/api/boards', { signal })).boards, staleTime: LOOKUP_STALE_MS });
export const useBoardList = () => useQuery(boardsQueryOptions());
