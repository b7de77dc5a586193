// Boards as every page reads them: one record type, one key factory and one list query, so the
// register, the bench's picker and the sessions filter share one copy of GET /api/boards.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../api';
import { RESOURCE_STALE_MS } from './stale';

/** A bench board as GET /api/boards returns it (server/db/models/board.model.ts). */
export interface BoardRecord {
  id: number;
  name: string;
  serial: string;
  fpgaPart: string;
  adapter: string;
  location: string;
  createdAt: string;
  updatedAt: string;
}

/** Every query about boards lives under `boardKeys.all`, so invalidating it reaches all of them. */
export const boardKeys = {
  all: ['boards'] as const,
  lists: () => [...boardKeys.all, 'list'] as const,
  details: () => [...boardKeys.all, 'detail'] as const,
  detail: (id: number) => [...boardKeys.details(), id] as const,
};

export const getBoards = async (signal?: AbortSignal) => (await api<{ boards: BoardRecord[] }>('/api/boards', { signal })).boards;

export const boardsQueryOptions = () => queryOptions({ queryKey: boardKeys.lists(), queryFn: ({ signal }) => getBoards(signal), staleTime: RESOURCE_STALE_MS });

export const useBoards = () => useQuery(boardsQueryOptions());
