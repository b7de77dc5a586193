// Cores as every page reads them: one record type, one key factory and one list query, so a page
// fetches GET /api/cores once and an edit anywhere refreshes every view of a core.
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Limits } from '../../../shared/link-engine/limits';
import type { ModelConfig } from '../../../shared/numeric/model-config';
import { api } from '../api';
import { RESOURCE_STALE_MS } from './stale';

/** How the bench talks to the core (server/schemas/core.ts linkProfileSchema). */
export interface LinkProfile {
  baud: number;
  crc: string;
}

/** A core as GET /api/cores and GET /api/cores/:id return it (server/db/models/core.model.ts). */
export interface CoreRecord {
  id: number;
  name: string;
  slug: string;
  linkProfile: LinkProfile;
  modelConfig: ModelConfig;
  limits: Limits;
  baselineSessionId: number | null;
  createdAt: string;
  updatedAt: string;
}

/** Every query about cores lives under `coreKeys.all`, so invalidating it reaches all of them. */
export const coreKeys = {
  all: ['cores'] as const,
  lists: () => [...coreKeys.all, 'list'] as const,
  details: () => [...coreKeys.all, 'detail'] as const,
  detail: (id: number) => [...coreKeys.details(), id] as const,
  goldenVectors: (id: number) => [...coreKeys.detail(id), 'golden-vectors'] as const,
};

export const getCores = async (signal?: AbortSignal) => (await api<{ cores: CoreRecord[] }>('/api/cores', { signal })).cores;

export const coresQueryOptions = () => queryOptions({ queryKey: coreKeys.lists(), queryFn: ({ signal }) => getCores(signal), staleTime: RESOURCE_STALE_MS });

export const useCores = () => useQuery(coresQueryOptions());
