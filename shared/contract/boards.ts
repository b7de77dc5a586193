// The boards API: the lab's FPGA boards.
import { z } from 'zod';
import { isoDate, text } from './common';

/** POST /api/boards */
export const boardBody = z.strictObject({
  name: text(120).min(1),
  serial: text(80),
  fpgaPart: text(80),
  adapter: text(120),
  location: text(120),
});
/** PATCH /api/boards/:id */
export const boardPatchBody = boardBody.partial();

export const boardRecord = z.object({
  id: z.number().int(),
  name: z.string(),
  serial: z.string(),
  fpgaPart: z.string(),
  adapter: z.string(),
  location: z.string(),
  createdAt: isoDate,
  updatedAt: isoDate,
});
export type BoardRecord = z.infer<typeof boardRecord>;

/** GET /api/boards */
export const boardListReply = z.object({ boards: z.array(boardRecord) });
/** GET, POST /api/boards, PATCH /api/boards/:id */
export const boardReply = z.object({ board: boardRecord });
