import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { buildKeys, type Named } from '../../../lib/resources/builds';

/** One decision on a build (server/routes/builds.ts reviewsOf). */
export interface ReviewRecord {
  id: number;
  buildId: number;
  reviewerId: number | null;
  reviewer?: Named | null;
  decision: 'approve' | 'reject';
  note: string;
  createdAt: string;
}

/** A build's review trail, newest first. */
export async function getBuildReviews(id: number, signal?: AbortSignal): Promise<ReviewRecord[]> {
  return (await api<{ reviews: ReviewRecord[] }>(`/api/builds/${id}/reviews`, { signal })).reviews;
}

export const buildReviewsQueryOptions = (id: number) =>
  queryOptions({ queryKey: buildKeys.reviews(id), queryFn: ({ signal }) => getBuildReviews(id, signal) });

export const useBuildReviews = (id: number) => useQuery(buildReviewsQueryOptions(id));
