// GET /api/condition-grid: every session of one build (or core) placed at its pair of operating
// conditions, the shmoo plot's cells, and each session's figures for a line plot.
import { z } from 'zod';
import { id, isoDate } from './common';
import { NAMED_CONDITIONS } from '../soak';

const axis = z.enum(NAMED_CONDITIONS as [string, ...string[]]);

export const conditionGridQuery = z
  .strictObject({ buildId: id.optional(), coreId: id.optional(), x: axis, y: axis })
  .refine((q) => (q.buildId === undefined) !== (q.coreId === undefined), { path: ['buildId'], message: 'give buildId or coreId, one of them' })
  .refine((q) => q.x !== q.y, { path: ['y'], message: 'x and y must be two different conditions' });
export type ConditionGridQuery = z.infer<typeof conditionGridQuery>;

/** A cell's verdict: unstable when any of its sessions had unstable codes, else fail when any failed. */
export const cellVerdict = z.enum(['pass', 'fail', 'unstable']);
export type CellVerdict = z.infer<typeof cellVerdict>;

export const conditionGridCell = z.object({
  x: z.number(),
  y: z.number(),
  verdict: cellVerdict,
  counts: z.object({ pass: z.number().int(), fail: z.number().int(), unstable: z.number().int() }),
  sessionIds: z.array(z.number().int()),
});
export type ConditionGridCell = z.infer<typeof conditionGridCell>;

export const conditionGridSession = z.object({
  id: z.number().int(),
  x: z.number().nullable(),
  y: z.number().nullable(),
  startedAt: isoDate,
  passed: z.boolean(),
  verdict: cellVerdict,
  maxAbsErrorLsb: z.number().nullable(),
  mismatches: z.number().int().nullable(),
  unstableCodes: z.number().int().nullable(),
});
export type ConditionGridSession = z.infer<typeof conditionGridSession>;

/** GET /api/condition-grid */
export const conditionGridReply = z.object({
  x: axis,
  y: axis,
  xs: z.array(z.number()),
  ys: z.array(z.number()),
  cells: z.array(conditionGridCell),
  /** Every session of the build or core, placed or not (a session without one of the two has x or y null). */
  sessions: z.array(conditionGridSession),
});
export type ConditionGrid = z.infer<typeof conditionGridReply>;
