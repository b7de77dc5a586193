// GET /api/condition-grid: every session of one build (or core) placed at its pair of operating
// conditions, the shmoo plot's cells, and each session's figures for a line plot.
import { z } from 'zod';
import { id } from './common';
import { NAMED_CONDITIONS } from '../soak';

const axis = z.enum(NAMED_CONDITIONS as [string, ...string[]]);

export const conditionGridQuery = z
  .strictObject({ buildId: id.optional(), coreId: id.optional(), x: axis, y: axis })
  .refine((q) => (q.buildId === undefined) !== (q.coreId === undefined), { path: ['buildId'], message: 'give buildId or coreId, one of them' })
  .refine((q) => q.x !== q.y, { path: ['y'], message: 'x and y must be two different conditions' });
export type ConditionGridQuery = z.infer<typeof conditionGridQuery>;

/** A cell's verdict: unstable when any of its sessions had unstable codes, else fail when any failed. */
export type CellVerdict = 'pass' | 'fail' | 'unstable';

export interface ConditionGridCell {
  x: number;
  y: number;
  verdict: CellVerdict;
  counts: Record<CellVerdict, number>;
  sessionIds: number[];
}

export interface ConditionGridSession {
  id: number;
  x: number | null;
  y: number | null;
  startedAt: string;
  passed: boolean;
  verdict: CellVerdict;
  maxAbsErrorLsb: number | null;
  mismatches: number | null;
  unstableCodes: number | null;
}

export interface ConditionGrid {
  x: string;
  y: string;
  xs: number[];
  ys: number[];
  cells: ConditionGridCell[];
  /** Every session of the build or core, placed or not (a session without one of the two has x or y null). */
  sessions: ConditionGridSession[];
}
