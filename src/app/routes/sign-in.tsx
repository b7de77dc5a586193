import { useNavigate, useSearchParams } from 'react-router-dom';
import { SignInForm } from '../../features/auth/components/sign-in-form';

/** Only same-site paths: a crafted ?next= must not send anyone elsewhere. */
const safeNext = (next: string | null) => (next && next.startsWith('/') && !next.startsWith('//') ? next : '/');

export function SignInRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const next = safeNext(params.get('next'));
  return (
    <div className="mx-auto mt-10 max-w-md rounded-lg border border-rule bg-panel p-8">
      <h1 className="mb-1 text-2xl font-bold">Sign in</h1>
      <p className="mb-6 text-ink-soft">Bench sessions, cores and boards belong to your team; sign in to reach them.</p>
      <SignInForm onSignedIn={() => navigate(next, { replace: true })} />
    </div>
  );
}
