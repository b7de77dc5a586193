import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { compareReply } from '../../../../shared/contract/compare';
import { apiReply } from '../../../lib/api';

export const compareKeys = {
  all: ['compare'] as const,
  of: (ids: number[]) => [...compareKeys.all, ids.join(',')] as const,
};

export const getCompare = (ids: number[], signal?: AbortSignal) => apiReply(compareReply, `/api/compare?ids=${ids.join(',')}`, { signal });

/** Stored sessions never change their samples, so a comparison stays good for a while. */
export const compareQueryOptions = (ids: number[]) =>
  queryOptions({ queryKey: compareKeys.of(ids), queryFn: ({ signal }) => getCompare(ids, signal), staleTime: 5 * 60_000 });

/** Idle below two sessions; keeps the last comparison on screen while the next one loads. */
export const useCompare = (ids: number[]) => useQuery({ ...compareQueryOptions(ids), enabled: ids.length >= 2, placeholderData: keepPreviousData });
