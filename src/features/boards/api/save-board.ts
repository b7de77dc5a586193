import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { boardReply } from '../../../../shared/contract/boards';
import { apiReply } from '../../../lib/api';
import { boardKeys } from '../../../lib/resources/boards';

const text = (max: number) => z.string().trim().max(max, `At most ${max} characters`);

/** POST /api/boards and PATCH /api/boards/:id take the same fields (server/routes/boards.ts). */
export const boardInputSchema = z.object({
  name: text(120).min(1, 'Give the board a name'),
  serial: text(80),
  fpgaPart: text(80),
  adapter: text(120),
  location: text(120),
});
export type BoardInput = z.infer<typeof boardInputSchema>;

/** Create (no id) or update (id) a board. */
export const saveBoard = async ({ id, input }: { id: number | null; input: BoardInput }) =>
  (await apiReply(boardReply, id === null ? '/api/boards' : `/api/boards/${id}`, { method: id === null ? 'POST' : 'PATCH', body: input })).board;

export function useSaveBoard() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: saveBoard,
    onSuccess: () => qc.invalidateQueries({ queryKey: boardKeys.all }),
  });
}
