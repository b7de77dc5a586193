import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { buildKeys } from './build-keys';
import type { ReviewRecord } from './build-types';

/** A build's review trail, newest first. */
export async function getBuildReviews(id: number, signal?: AbortSignal): Promise<ReviewRecord[]> {
  return (await api<{ reviews: ReviewRecord[] }>(`/api/builds/${id}/reviews`, { signal })).reviews;
}

export const buildReviewsQueryOptions = (id: number) =>
  queryOptions({ queryKey: buildKeys.reviews(id), queryFn: ({ signal }) => getBuildReviews(id, signal) });

export const useBuildReviews = (id: number) => useQuery(buildReviewsQueryOptions(id));
