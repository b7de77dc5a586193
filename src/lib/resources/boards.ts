// Boards as every page reads them: one record type, one key factory and one list query, so the
// register, the bench's picker and the sessions filter share one copy of GET /api/boards.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { boardListReply } from '../../../shared/contract/boards';
import { apiReply } from '../api';
import { RESOURCE_STALE_MS } from './stale';

/** A bench board as GET /api/boards returns it (the contract's). */
export type { BoardRecord } from '../../../shared/contract/boards';

/** Every query about boards lives under `boardKeys.all`, so invalidating it reaches all of them. */
export const boardKeys = {
  all: ['boards'] as const,
  lists: () => [...boardKeys.all, 'list'] as const,
  details: () => [...boardKeys.all, 'detail'] as const,
  detail: (id: number) => [...boardKeys.details(), id] as const,
};

export const getBoards = async (signal?: AbortSignal) => (await apiReply(boardListReply, '/api/boards', { signal })).boards;

export const boardsQueryOptions = () => queryOptions({ queryKey: boardKeys.lists(), queryFn: ({ signal }) => getBoards(signal), staleTime: RESOURCE_STALE_MS });

export const useBoards = () => useQuery(boardsQueryOptions());
