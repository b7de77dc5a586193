// Query keys of the sessions feature, general to specific. The root is the one the Bench page's
// save invalidates, so a new session shows in the list at once. Samples and captures never
// change once stored: they live under their own roots, so editing notes does not re-score them.
import type { SessionFilters } from '../list/session-filters';

export const sessionKeys = {
  all: ['sessions'] as const,
  lists: () => [...sessionKeys.all, 'list'] as const,
  list: (filters: SessionFilters) => [...sessionKeys.lists(), filters] as const,
  details: () => [...sessionKeys.all, 'detail'] as const,
  detail: (id: number) => [...sessionKeys.details(), id] as const,
  comments: (id: number) => [...sessionKeys.detail(id), 'comments'] as const,
  plots: (id: number) => ['session-plots', id] as const,
  capture: (id: number) => ['session-capture', id] as const,
};
