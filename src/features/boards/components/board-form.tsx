import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { btn, btnPrimary, fieldError, input, label } from '../../../components/ui';
import type { BoardRecord } from '../../../lib/resources/boards';
import { boardInputSchema, useSaveBoard, type BoardInput } from '../api/save-board';

const FIELDS: Array<{ key: keyof BoardInput; label: string; placeholder: string }> = [
  { key: 'name', label: 'Name', placeholder: 'Bay 2 / bench C' },
  { key: 'serial', label: 'Serial', placeholder: 'AB-0301' },
  { key: 'fpgaPart', label: 'FPGA part', placeholder: 'the device on the board' },
  { key: 'adapter', label: 'UART adapter', placeholder: 'USB-UART bridge, 3.3 V' },
  { key: 'location', label: 'Location', placeholder: 'Signal lab, bay 2' },
];

/** Create (board null) or edit a board; `onDone` gets the saved board. */
export function BoardForm({ board, onDone, onCancel }: { board: BoardRecord | null; onDone: (b: BoardRecord) => void; onCancel: () => void }) {
  const save = useSaveBoard();
  const { register, handleSubmit, formState } = useForm<BoardInput>({
    resolver: zodResolver(boardInputSchema),
    defaultValues: { name: board?.name ?? '', serial: board?.serial ?? '', fpgaPart: board?.fpgaPart ?? '', adapter: board?.adapter ?? '', location: board?.location ?? '' },
  });
  const submit = (v: BoardInput) => save.mutate({ id: board?.id ?? null, input: v }, { onSuccess: onDone });
  return (
    <form noValidate onSubmit={handleSubmit(submit)} aria-label={board ? 'Edit board' : 'New board'} className="grid gap-3">
      <fieldset disabled={save.isPending} className="grid items-start gap-3 sm:grid-cols-2 lg:grid-cols-5">
        {FIELDS.map((f) => {
          const error = formState.errors[f.key]?.message;
          return (
            <label key={f.key} className={`${label} content-start`}>
              <span className="font-bold">{f.label}</span>
              <input className={input} placeholder={f.placeholder} aria-invalid={error ? true : undefined} {...register(f.key)} />
              {error && <span className={fieldError}>{error}</span>}
            </label>
          );
        })}
      </fieldset>
      <div className="flex flex-wrap items-center gap-3">
        <button type="submit" className={btnPrimary} disabled={save.isPending}>
          {save.isPending ? 'Saving…' : board ? 'Save board' : 'Add board'}
        </button>
        <button type="button" className={btn} onClick={onCancel} disabled={save.isPending}>
          Cancel
        </button>
        {save.isError && (
          <p role="alert" className={fieldError}>
            The board was not saved: {save.error.message}
          </p>
        )}
      </div>
    </form>
  );
}
