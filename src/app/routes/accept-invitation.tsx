import { useNavigate, useParams } from 'react-router-dom';
import { AcceptInvitationForm } from '../../features/auth/components/accept-invitation-form';

/** The page an invitation mail links to: /invite/<one-time token>. */
export function AcceptInvitationRoute() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  return (
    <div className="mx-auto mt-10 max-w-md rounded-lg border border-rule bg-panel p-8">
      <h1 className="mb-1 text-2xl font-bold">Join your team’s bench</h1>
      <p className="mb-6 text-ink-soft">Choose the name your colleagues will see and a password. The link works once.</p>
      <AcceptInvitationForm token={token} onDone={() => navigate('/', { replace: true })} />
    </div>
  );
}
