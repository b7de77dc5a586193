import { queryOptions, useQuery } from '@tanstack/react-query';
import { boardReply } from '../../../../shared/contract/boards';
import { apiReply } from '../../../lib/api';
import { boardKeys } from '../../../lib/resources/boards';

export const getBoard = async (id: number, signal?: AbortSignal) => (await apiReply(boardReply, `/api/boards/${id}`, { signal })).board;

export const boardQueryOptions = (id: number) => queryOptions({ queryKey: boardKeys.detail(id), queryFn: ({ signal }) => getBoard(id, signal) });

export const useBoard = (id: number) => useQuery(boardQueryOptions(id));
