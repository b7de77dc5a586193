// One core with its watchers: read by the core's own page and by a session's pages (for the
// model configuration and limits that score it), so both share one cached copy.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { coreDetailReply } from '../../../shared/contract/cores';
import { apiReply } from '../api';
import { coreKeys } from './cores';
import { RESOURCE_STALE_MS } from './stale';

/** GET /api/cores/:id: the core, who watches it, and whether the caller does. */
export type { CoreDetailReply as CoreDetail } from '../../../shared/contract/cores';
export type { Named as Watcher } from '../../../shared/contract/common';

export const getCore = (id: number, signal?: AbortSignal) => apiReply(coreDetailReply, `/api/cores/${id}`, { signal });

export const coreQueryOptions = (id: number) => queryOptions({ queryKey: coreKeys.detail(id), queryFn: ({ signal }) => getCore(id, signal), staleTime: RESOURCE_STALE_MS });

/** Idle while `id` is null (a session page before the session says which core). */
export const useCore = (id: number | null) => useQuery({ ...coreQueryOptions(id ?? 0), enabled: id !== null });
