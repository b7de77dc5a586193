import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { btn, btnPrimary, fieldError, input, label, panel, panelTitle } from '../../../components/ui';
import { useBuildReviews } from '../api/get-build-reviews';
import { useRequestReview } from '../api/request-review';
import { reviewSchema, useReviewBuild, type ReviewInput } from '../api/review-build';
import { formatWhen } from './build-format';

function RequestReview({ buildId }: { buildId: number }) {
  const request = useRequestReview(buildId);
  return (
    <div className="grid gap-1">
      <button type="button" className={`${btn} justify-self-start`} disabled={request.isPending} onClick={() => request.mutate()}>
        {request.isPending ? 'Asking…' : 'Request review'}
      </button>
      {request.isSuccess && (
        <p role="status" className="text-sm" data-testid="review-requested">
          {request.data.reviewers === 0
            ? 'There is no reviewer on the team to ask.'
            : request.data.mailed
              ? `Mailed ${request.data.reviewers} reviewer${request.data.reviewers === 1 ? '' : 's'}.`
              : `${request.data.reviewers} reviewer${request.data.reviewers === 1 ? '' : 's'} to ask, but the mail could not be sent.`}
        </p>
      )}
      {request.isError && (
        <p role="alert" className={fieldError}>
          The request was not sent: {request.error.message}
        </p>
      )}
    </div>
  );
}

function DecisionForm({ buildId }: { buildId: number }) {
  const review = useReviewBuild(buildId);
  const { register, handleSubmit, setValue, reset, formState } = useForm<ReviewInput>({ resolver: zodResolver(reviewSchema), defaultValues: { decision: 'approve', note: '' } });
  const submit = (v: ReviewInput) => review.mutate(v, { onSuccess: () => reset({ decision: 'approve', note: '' }) });
  // Two submit buttons: each sets the decision it stands for before the form is checked.
  const decide = (decision: ReviewInput['decision']) => () => setValue('decision', decision);
  return (
    <form noValidate onSubmit={handleSubmit(submit)} aria-label="Review decision" className="grid gap-2">
      <label className={label}>
        Note for the author
        <textarea className={input} rows={3} {...register('note')} placeholder="What you checked, and why you decided so" />
        {formState.errors.note && <span className={fieldError}>{formState.errors.note.message}</span>}
      </label>
      <div className="flex gap-2">
        <button type="submit" className={btnPrimary} disabled={review.isPending} onClick={decide('approve')}>
          Approve
        </button>
        <button type="submit" className={`${btn} border-fail text-fail`} disabled={review.isPending} onClick={decide('reject')}>
          Reject
        </button>
      </div>
      {review.isSuccess && (
        <p role="status" className="text-sm">
          {review.data.review.decision === 'approve' ? 'Approved' : 'Rejected'}; {review.data.mailed ? 'the author was mailed.' : 'the author could not be mailed.'}
        </p>
      )}
      {review.isError && (
        <p role="alert" className={fieldError}>
          The decision was not recorded: {review.error.message}
        </p>
      )}
    </form>
  );
}

/** Asking for a review (engineers), deciding (every role may sign a build off), and every decision so far. */
export function ReviewPanel({ buildId, canRequest }: { buildId: number; canRequest: boolean }) {
  const reviews = useBuildReviews(buildId);
  return (
    <section aria-labelledby="reviews-title" className={panel}>
      <h2 id="reviews-title" className={panelTitle}>
        Review
      </h2>
      <div className="grid gap-4">
        {canRequest && <RequestReview buildId={buildId} />}
        <DecisionForm buildId={buildId} />
        <div>
          <h3 className="mb-1 text-sm font-bold">Trail</h3>
          {reviews.isPending && <p className="text-sm text-ink-soft">Loading reviews…</p>}
          {reviews.isError && (
            <p role="alert" className="text-sm text-fail">
              The reviews could not be loaded: {reviews.error.message}
            </p>
          )}
          {reviews.data?.length === 0 && <p className="text-sm text-ink-soft">Not reviewed yet.</p>}
          <ol className="grid gap-2" aria-label="Review trail">
            {reviews.data?.map((r) => (
              <li key={r.id} className={`rounded border-l-4 bg-paper px-3 py-2 text-sm ${r.decision === 'approve' ? 'border-pass' : 'border-fail'}`}>
                <p>
                  <span className={`font-bold uppercase ${r.decision === 'approve' ? 'text-pass' : 'text-fail'}`}>{r.decision === 'approve' ? 'approved' : 'rejected'}</span> by{' '}
                  {r.reviewer?.name ?? 'a former reviewer'} · <span className="text-ink-soft">{formatWhen(r.createdAt)}</span>
                </p>
                {r.note ? <p className="mt-1 whitespace-pre-wrap">{r.note}</p> : <p className="mt-1 text-ink-soft">No note.</p>}
              </li>
            ))}
          </ol>
        </div>
      </div>
    </section>
  );
}
