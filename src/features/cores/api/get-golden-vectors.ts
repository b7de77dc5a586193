import { queryOptions, useQuery } from '@tanstack/react-query';
import { goldenVectorListReply } from '../../../../shared/contract/misc';
import { apiReply } from '../../../lib/api';
import { coreKeys } from '../../../lib/resources/cores';

/** A golden-vector set as the server summarises it against the core's model. */
export type { GoldenVectorSet } from '../../../../shared/contract/misc';

export const getGoldenVectors = async (coreId: number, signal?: AbortSignal) =>
  (await apiReply(goldenVectorListReply, `/api/cores/${coreId}/golden-vectors`, { signal })).sets;

export const goldenVectorsQueryOptions = (coreId: number) =>
  queryOptions({ queryKey: coreKeys.goldenVectors(coreId), queryFn: ({ signal }) => getGoldenVectors(coreId, signal) });

export const useGoldenVectors = (coreId: number) => useQuery(goldenVectorsQueryOptions(coreId));
