import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';

/** A bench board as the register keeps it. */
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

// Under the bench's board-picker root, so one invalidation refreshes both.
export const boardKeys = {
  all: ['boards'] as const,
  lists: () => [...boardKeys.all, 'list'] as const,
  detail: (id: number) => [...boardKeys.all, 'detail', id] as const,
};

export const getBoards = async (signal?: AbortSignal) => (await api<{ boards: BoardRecord[] }>('/api/boards', { signal })).boards;

export const boardsQueryOptions = () => queryOptions({ queryKey: boardKeys.lists(), queryFn: ({ signal }) => getBoards(signal) });

export const useBoardList = () => useQuery(boardsQueryOptions());
