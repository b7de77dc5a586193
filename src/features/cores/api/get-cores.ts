import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import type { Limits } from '../../../../shared/bench/limits';
import type { ModelConfig } from '../../../../shared/numeric/model-config';

/** How the bench talks to the core (server/schemas/core.ts linkProfileSchema). */
export interface LinkProfile {
  baud: number;
  crc: string;
}

/** A core as GET /api/cores returns it. */
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

// Under the same root as the bench's core picker, so one invalidation refreshes both.
export const coreKeys = {
  all: ['cores'] as const,
  lists: () => [...coreKeys.all, 'list'] as const,
  detail: (id: number) => [...coreKeys.all, 'detail', id] as const,
  goldenVectors: (id: number) => [...coreKeys.detail(id), 'golden-vectors'] as const,
};

export const getCores = async (signal?: AbortSignal) => (await api<{ cores: CoreRecord[] }>('/api/cores', { signal })).cores;

export const coresQueryOptions = () => queryOptions({ queryKey: coreKeys.lists(), queryFn: ({ signal }) => getCores(signal) });

export const useCoreList = () => useQuery(coresQueryOptions());
