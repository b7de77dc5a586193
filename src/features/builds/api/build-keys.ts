// Query keys of the builds feature, general to specific. The root is shared with the Bench page's
// build picker, so a new build shows there too. A build's sessions live under the sessions root,
// which every session upload invalidates.
export const buildKeys = {
  all: ['builds'] as const,
  lists: () => [...buildKeys.all, 'list'] as const,
  list: (coreId: number | null) => [...buildKeys.lists(), { coreId }] as const,
  details: () => [...buildKeys.all, 'detail'] as const,
  detail: (id: number) => [...buildKeys.details(), id] as const,
  reviews: (id: number) => [...buildKeys.detail(id), 'reviews'] as const,
  sessions: (id: number) => ['sessions', 'of-build', id] as const,
};
