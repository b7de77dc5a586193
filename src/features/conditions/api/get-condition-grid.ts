import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiReply } from '../../../lib/api';
import { conditionGridReply } from '../../../../shared/contract/condition-grid';

export interface GridChoice {
  buildId: number;
  x: string;
  y: string;
}

export const conditionGridKeys = { all: ['condition-grid'] as const, grid: (c: GridChoice) => [...conditionGridKeys.all, c] as const };

export const getConditionGrid = (c: GridChoice, signal?: AbortSignal) =>
  apiReply(conditionGridReply, `/api/condition-grid?${new URLSearchParams({ buildId: String(c.buildId), x: c.x, y: c.y })}`, { signal });

export const conditionGridQueryOptions = (c: GridChoice) => queryOptions({ queryKey: conditionGridKeys.grid(c), queryFn: ({ signal }) => getConditionGrid(c, signal) });

/** Idle until a build is chosen. */
export const useConditionGrid = (c: GridChoice | null) => useQuery({ ...conditionGridQueryOptions(c ?? { buildId: 0, x: '', y: '' }), enabled: c !== null });
