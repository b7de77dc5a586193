import { useQuery } from '@tanstack/react-query';
import { sessionListQueryOptions } from '../../../lib/resources/sessions';

/** The latest sessions run on a build (at most 100), and how many there are in all. */
export const buildSessionsQueryOptions = (buildId: number) => sessionListQueryOptions({ buildId, sort: '-startedAt', pageSize: 100 });

export const useBuildSessions = (buildId: number) => useQuery(buildSessionsQueryOptions(buildId));
