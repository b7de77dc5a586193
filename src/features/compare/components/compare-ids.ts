// The chosen sessions live in the address (?ids=12,15), so a comparison can be shared as a link.

export const MAX_COMPARED = 6;

/** The ids in `?ids=`, in order, each once, at most MAX_COMPARED; anything else is dropped. */
export function parseIds(raw: string | null): number[] {
  if (!raw) return [];
  const out: number[] = [];
  for (const part of raw.split(',')) {
    const id = Number(part.trim());
    if (Number.isInteger(id) && id > 0 && !out.includes(id)) out.push(id);
  }
  return out.slice(0, MAX_COMPARED);
}

export const formatIds = (ids: number[]) => ids.join(',');
