import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { ApiError } from '../../../lib/api';
import { loginInputSchema, useLogin, type LoginInput } from '../api/login';

const field = 'w-full rounded border border-rule bg-white px-3 py-2 text-base focus:border-signal';

/** E-mail and password; calls onSignedIn once the server accepts them. */
export function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const login = useLogin();
  const { register, handleSubmit, formState } = useForm<LoginInput>({ resolver: zodResolver(loginInputSchema), defaultValues: { email: '', password: '' } });
  const { errors } = formState;
  const failure = login.error
    ? login.error instanceof ApiError && login.error.status === 401
      ? 'Wrong e-mail or password.'
      : login.error.message
    : null;

  return (
    <form noValidate onSubmit={handleSubmit((v) => login.mutate(v, { onSuccess: onSignedIn }))} className="grid gap-4">
      <label className="grid gap-1">
        <span className="font-bold">E-mail</span>
        <input type="email" autoComplete="username" className={field} aria-invalid={!!errors.email} {...register('email')} />
        {errors.email && <span className="text-fail text-sm">{errors.email.message}</span>}
      </label>
      <label className="grid gap-1">
        <span className="font-bold">Password</span>
        <input type="password" autoComplete="current-password" className={field} aria-invalid={!!errors.password} {...register('password')} />
        {errors.password && <span className="text-fail text-sm">{errors.password.message}</span>}
      </label>
      {failure && (
        <p role="alert" className="rounded border border-fail bg-fail-soft px-3 py-2 text-fail">
          {failure}
        </p>
      )}
      <button type="submit" disabled={login.isPending} className="rounded bg-ink px-4 py-2 font-bold text-paper hover:bg-ink-soft disabled:opacity-60">
        {login.isPending ? 'Signing in…' : 'Sign in'}
      </button>
    </form>
  );
}
