import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { coreKeys } from '../../../lib/resources/cores';

/** A golden-vector set as the server summarises it against the core's model. */
export interface GoldenVectorSet {
  id: number;
  name: string;
  count: number;
  distinctCodes: number;
  /** Share of the core's angle-code range the set covers, 0..1. */
  coverageShare: number;
  modelMismatches: number;
  createdAt: string;
}

export const getGoldenVectors = async (coreId: number, signal?: AbortSignal) =>
  (await api<{ sets: GoldenVectorSet[] }>(`/api/cores/${coreId}/golden-vectors`, { signal })).sets;

export const goldenVectorsQueryOptions = (coreId: number) =>
  queryOptions({ queryKey: coreKeys.goldenVectors(coreId), queryFn: ({ signal }) => getGoldenVectors(coreId, signal) });

export const useGoldenVectors = (coreId: number) => useQuery(goldenVectorsQueryOptions(coreId));
