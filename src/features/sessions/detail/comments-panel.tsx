import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { btnPrimary, fieldError, input, label, panel, panelTitle } from '../../../components/ui';
import { addCommentInput, useAddComment, type AddCommentInput } from '../api/add-comment';
import { useDeleteComment } from '../api/delete-comment';
import { useComments } from '../api/get-comments';

const when = (iso: string) => new Date(iso).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' });

/** Remarks on a session, by anyone signed in; shown as plain text, whatever markup they hold. */
export function CommentsPanel({ sessionId, me }: { sessionId: number; me: { id: number; role: string } }) {
  const comments = useComments(sessionId);
  const add = useAddComment(sessionId);
  const remove = useDeleteComment(sessionId);
  const form = useForm<AddCommentInput>({ resolver: zodResolver(addCommentInput), defaultValues: { body: '' } });
  const onSubmit = form.handleSubmit(async (v) => {
    await add.mutateAsync(v);
    form.reset();
  });
  return (
    <section aria-labelledby="comments-title" className={panel}>
      <h2 id="comments-title" className={panelTitle}>
        Comments
      </h2>
      {comments.isPending && <p className="text-sm text-ink-soft">Loading comments…</p>}
      {comments.isError && (
        <p role="alert" className="text-sm font-bold text-fail">
          The comments could not be loaded: {comments.error.message}
        </p>
      )}
      {comments.data && comments.data.length === 0 && <p className="text-sm text-ink-soft">No comments yet.</p>}
      {comments.data && comments.data.length > 0 && (
        <ol className="mb-3 grid gap-2" aria-label="Comments on this session">
          {comments.data.map((c) => (
            <li key={c.id} className="rounded border border-rule bg-white p-2">
              <div className="mb-1 flex items-baseline gap-2 text-xs text-ink-soft">
                <span className="font-bold text-ink">{c.author?.name ?? 'A former user'}</span>
                <time dateTime={c.createdAt}>{when(c.createdAt)}</time>
                {(c.authorId === me.id || me.role === 'admin') && (
                  <button type="button" className="ml-auto underline hover:text-fail" disabled={remove.isPending} onClick={() => remove.mutate(c.id)}>
                    Delete<span className="sr-only"> this comment</span>
                  </button>
                )}
              </div>
              <p className="whitespace-pre-wrap break-words text-sm">{c.body}</p>
            </li>
          ))}
        </ol>
      )}
      {remove.isError && (
        <p role="alert" className={fieldError}>
          Not deleted: {remove.error.message}
        </p>
      )}
      <form aria-label="Add a comment" className="grid gap-2" onSubmit={(e) => void onSubmit(e).catch(() => undefined)}>
        <label className={label}>
          Your comment
          <textarea className={`${input} min-h-20 font-sans`} {...form.register('body')} aria-invalid={!!form.formState.errors.body} />
        </label>
        {form.formState.errors.body && <span className={fieldError}>{form.formState.errors.body.message}</span>}
        {add.isError && (
          <p role="alert" className={fieldError}>
            Not posted: {add.error.message}
          </p>
        )}
        <div>
          <button type="submit" className={btnPrimary} disabled={add.isPending}>
            {add.isPending ? 'Posting…' : 'Post comment'}
          </button>
        </div>
      </form>
    </section>
  );
}
