import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';

export interface BoardItem {
  id: number;
  name: string;
}

export const boardKeys = { all: ['boards'] as const };

export const getBoards = async (signal?: AbortSignal) => (await api<{ boards: BoardItem[] }>('/api/boards', { signal })).boards;

export const boardsQueryOptions = () => queryOptions({ queryKey: boardKeys.all, queryFn: ({ signal }) => getBoards(signal), staleTime: 60_000 });

export const useBoards = () => useQuery(boardsQueryOptions());
