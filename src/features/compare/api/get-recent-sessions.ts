import { useQuery } from '@tanstack/react-query';
import { sessionDetailQueryOptions, sessionListQueryOptions, type SessionListParams } from '../../../lib/resources/sessions';

/** The 30 latest sessions, of one core when `coreId` is set. */
const recentParams = (coreId: number | null): SessionListParams => ({ ...(coreId === null ? {} : { coreId }), sort: '-startedAt', pageSize: 30 });

export const useRecentSessions = (coreId: number | null) => useQuery({ ...sessionListQueryOptions(recentParams(coreId)), select: (page) => page.items });

/** The core of one session, for the picker before a comparison exists (the session's own detail query). */
export const useSessionCore = (id: number | null) => useQuery({ ...sessionDetailQueryOptions(id ?? 0), select: (s) => s.coreId, enabled: id !== null });
