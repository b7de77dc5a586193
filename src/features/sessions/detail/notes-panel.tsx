import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { btn, btnPrimary, fieldError, input, label, panel, panelTitle } from '../../../components/ui';
import { useUpdateSession } from '../api/update-session';
import type { SessionRecord } from '../../../lib/resources/sessions';

export const splitTags = (v: string) => [...new Set(v.split(',').map((t) => t.trim()).filter(Boolean))];

const formSchema = z.object({
  notes: z.string().max(10_000, 'Notes are limited to 10,000 characters'),
  tags: z
    .string()
    .refine((v) => splitTags(v).length <= 20, 'At most 20 tags')
    .refine((v) => splitTags(v).every((t) => t.length <= 40), 'Each tag is at most 40 characters'),
});
type NotesForm = z.infer<typeof formSchema>;

/** Notes and tags: an engineer edits them, everyone else reads them. */
export function NotesPanel({ session, canEdit }: { session: SessionRecord; canEdit: boolean }) {
  const [editing, setEditing] = useState(false);
  return (
    <section aria-labelledby="notes-title" className={panel}>
      <div className="mb-2 flex items-center gap-2">
        <h2 id="notes-title" className={`${panelTitle} mb-0 mr-auto`}>
          Notes and tags
        </h2>
        {canEdit && !editing && (
          <button type="button" className={btn} onClick={() => setEditing(true)}>
            Edit notes and tags
          </button>
        )}
      </div>
      {editing ? (
        <NotesEditor session={session} onDone={() => setEditing(false)} />
      ) : (
        <>
          <p data-testid="session-notes" className="whitespace-pre-wrap text-sm">
            {session.notes || <span className="text-ink-soft">No notes.</span>}
          </p>
          <ul aria-label="Tags" className="mt-2 flex flex-wrap gap-1">
            {session.tags.length === 0 && <li className="text-sm text-ink-soft">No tags.</li>}
            {session.tags.map((t) => (
              <li key={t} className="rounded bg-reference-soft px-1.5 py-0.5 font-mono text-xs">
                {t}
              </li>
            ))}
          </ul>
        </>
      )}
    </section>
  );
}

function NotesEditor({ session, onDone }: { session: SessionRecord; onDone: () => void }) {
  const update = useUpdateSession(session.id, session.coreId);
  const form = useForm<NotesForm>({ resolver: zodResolver(formSchema), defaultValues: { notes: session.notes, tags: session.tags.join(', ') } });
  const { errors } = form.formState;
  const onSubmit = form.handleSubmit(async (v) => {
    await update.mutateAsync({ notes: v.notes, tags: splitTags(v.tags) });
    onDone();
  });
  return (
    <form aria-label="Edit notes and tags" className="grid gap-3" onSubmit={(e) => void onSubmit(e).catch(() => undefined)}>
      <label className={label}>
        Notes
        <textarea className={`${input} min-h-28 font-sans`} {...form.register('notes')} aria-invalid={!!errors.notes} />
        {errors.notes && <span className={fieldError}>{errors.notes.message}</span>}
      </label>
      <label className={label}>
        Tags (comma-separated)
        <input className={input} {...form.register('tags')} aria-invalid={!!errors.tags} />
        {errors.tags && <span className={fieldError}>{errors.tags.message}</span>}
      </label>
      {update.isError && (
        <p role="alert" className={fieldError}>
          Not saved: {update.error.message}
        </p>
      )}
      <div className="flex gap-2">
        <button type="submit" className={btnPrimary} disabled={update.isPending}>
          {update.isPending ? 'Saving…' : 'Save notes and tags'}
        </button>
        <button type="button" className={btn} onClick={onDone} disabled={update.isPending}>
          Cancel
        </button>
      </div>
    </form>
  );
}
