// How far the scoring of each session has got, for the progress line (query results cannot
// stream, so progress travels beside them).
type Progress = { done: number; total: number };
const progress = new Map<number, Progress>();
const listeners = new Set<() => void>();

export const scoringProgress = {
  set(id: number, p: Progress | null) {
    if (p) progress.set(id, p);
    else progress.delete(id);
    listeners.forEach((l) => l());
  },
  get: (id: number) => progress.get(id) ?? null,
  subscribe(l: () => void) {
    listeners.add(l);
    return () => void listeners.delete(l);
  },
};
