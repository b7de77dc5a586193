// The stored samples, scored again in the browser (in a worker) under the core's own model and
// reduced to chart data. Samples never change once stored, so the result is kept for good.
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ModelConfig } from '../../../../shared/numeric';
import type { VectorConfig } from '../../../../shared/vectoring';
import { runStoredScore, runVectorStoredScore } from '../scoring/run-stored-score';
import { scoringProgress } from '../scoring/scoring-progress';
import { fetchBytes } from './fetch-bytes';
import { sessionKeys } from '../../../lib/resources/sessions';

export async function getSessionPlots(id: number, config: ModelConfig, signal?: AbortSignal) {
  const bytes = await fetchBytes(`/api/sessions/${id}/samples`, signal);
  try {
    return await runStoredScore(bytes, config, (done, total) => scoringProgress.set(id, { done, total }), signal);
  } finally {
    scoringProgress.set(id, null);
  }
}

export const sessionPlotsQueryOptions = (id: number, config: ModelConfig | undefined) =>
  queryOptions({
    queryKey: [...sessionKeys.plots(id), config ?? null],
    queryFn: ({ signal }) => getSessionPlots(id, config!, signal),
    enabled: config !== undefined,
    staleTime: Infinity,
    gcTime: 5 * 60_000,
    retry: false,
  });

export const useSessionPlots = (id: number, config: ModelConfig | undefined) => useQuery(sessionPlotsQueryOptions(id, config));

/** A vectoring session's samples, scored again in the browser under the core's vectoring configuration. */
export async function getVectorSessionPlots(id: number, config: VectorConfig, signal?: AbortSignal) {
  const bytes = await fetchBytes(`/api/sessions/${id}/samples`, signal);
  try {
    return await runVectorStoredScore(bytes, config, (done, total) => scoringProgress.set(id, { done, total }), signal);
  } finally {
    scoringProgress.set(id, null);
  }
}

export const vectorSessionPlotsQueryOptions = (id: number, config: VectorConfig | undefined) =>
  queryOptions({
    queryKey: [...sessionKeys.plots(id), 'vectoring', config ?? null],
    queryFn: ({ signal }) => getVectorSessionPlots(id, config!, signal),
    enabled: config !== undefined,
    staleTime: Infinity,
    gcTime: 5 * 60_000,
    retry: false,
  });

export const useVectorSessionPlots = (id: number, config: VectorConfig | undefined) => useQuery(vectorSessionPlotsQueryOptions(id, config));
