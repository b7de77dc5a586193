import { queryOptions, useQuery } from '@tanstack/react-query';
import { reviewListReply } from '../../../../shared/contract/builds';
import { apiReply } from '../../../lib/api';
import { buildKeys } from '../../../lib/resources/builds';

/** One decision on a build, with its reviewer. */
export type { Review as ReviewRecord } from '../../../../shared/contract/builds';

/** A build's review trail, newest first. */
export async function getBuildReviews(id: number, signal?: AbortSignal) {
  return (await apiReply(reviewListReply, `/api/builds/${id}/reviews`, { signal })).reviews;
}

export const buildReviewsQueryOptions = (id: number) =>
  queryOptions({ queryKey: buildKeys.reviews(id), queryFn: ({ signal }) => getBuildReviews(id, signal) });

export const useBuildReviews = (id: number) => useQuery(buildReviewsQueryOptions(id));
