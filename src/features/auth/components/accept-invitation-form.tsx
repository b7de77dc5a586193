import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import { btnPrimary, fieldError, input, label } from '../../../components/ui';
import { ApiError } from '../../../lib/api';
import { acceptInputSchema, useAcceptInvitation, type AcceptInput } from '../api/accept-invitation';
import { authKeys } from '../api/get-me';

/** Name and password for an invited account; signs the new user in when the server accepts. */
export function AcceptInvitationForm({ token, onDone }: { token: string; onDone: () => void }) {
  const qc = useQueryClient();
  const accept = useAcceptInvitation(token);
  const { register, handleSubmit, formState } = useForm<AcceptInput>({ resolver: zodResolver(acceptInputSchema), defaultValues: { name: '', password: '', confirm: '' } });
  const { errors } = formState;
  const failure = accept.error
    ? accept.error instanceof ApiError && accept.error.code === 'bad_invitation'
      ? 'This invitation link is unknown, already used or expired. Ask an admin for a new one.'
      : accept.error.message
    : null;
  const submit = (v: AcceptInput) =>
    accept.mutate(v, {
      onSuccess: async (user) => {
        qc.setQueryData(authKeys.me(), user);
        await qc.invalidateQueries({ queryKey: authKeys.all });
        onDone();
      },
    });

  return (
    <form noValidate onSubmit={handleSubmit(submit)} className="grid gap-4">
      <label className={label}>
        <span className="font-bold">Your name</span>
        <input autoComplete="name" className={input} aria-invalid={!!errors.name} {...register('name')} />
        {errors.name && <span className={fieldError}>{errors.name.message}</span>}
      </label>
      <label className={label}>
        <span className="font-bold">Password</span>
        <input type="password" autoComplete="new-password" className={input} aria-invalid={!!errors.password} {...register('password')} />
        {errors.password && <span className={fieldError}>{errors.password.message}</span>}
      </label>
      <label className={label}>
        <span className="font-bold">Password again</span>
        <input type="password" autoComplete="new-password" className={input} aria-invalid={!!errors.confirm} {...register('confirm')} />
        {errors.confirm && <span className={fieldError}>{errors.confirm.message}</span>}
      </label>
      {failure && (
        <p role="alert" className="rounded border border-fail bg-fail-soft px-3 py-2 text-fail">
          {failure}
        </p>
      )}
      <button type="submit" disabled={accept.isPending} className={btnPrimary}>
        {accept.isPending ? 'Creating your account…' : 'Create account and sign in'}
      </button>
    </form>
  );
}
