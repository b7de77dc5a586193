import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { boardKeys, type BoardRecord } from '../../../lib/resources/boards';

export const getBoard = async (id: number, signal?: AbortSignal) => (await api<{ board: BoardRecord }>(`/api/boards/${id}`, { signal })).board;

export const boardQueryOptions = (id: number) => queryOptions({ queryKey: boardKeys.detail(id), queryFn: ({ signal }) => getBoard(id, signal) });

export const useBoard = (id: number) => useQuery(boardQueryOptions(id));
