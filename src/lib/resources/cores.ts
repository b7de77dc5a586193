// Cores as every page reads them: one record type, one key factory and one list query, so a page
// fetches GET /api/cores once and an edit anywhere refreshes every view of a core.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { coreListReply } from '../../../shared/contract/cores';
import { apiReply } from '../api';
import { RESOURCE_STALE_MS } from './stale';

/** A core as GET /api/cores and GET /api/cores/:id return it, and how the bench talks to it (the contract's). */
export type { CoreRecord, LinkProfile } from '../../../shared/contract/cores';

/** Every query about cores lives under `coreKeys.all`, so invalidating it reaches all of them. */
export const coreKeys = {
  all: ['cores'] as const,
  lists: () => [...coreKeys.all, 'list'] as const,
  details: () => [...coreKeys.all, 'detail'] as const,
  detail: (id: number) => [...coreKeys.details(), id] as const,
  goldenVectors: (id: number) => [...coreKeys.detail(id), 'golden-vectors'] as const,
};

export const getCores = async (signal?: AbortSignal) => (await apiReply(coreListReply, '/api/cores', { signal })).cores;

export const coresQueryOptions = () => queryOptions({ queryKey: coreKeys.lists(), queryFn: ({ signal }) => getCores(signal), staleTime: RESOURCE_STALE_MS });

export const useCores = () => useQuery(coresQueryOptions());
