import { Link, useNavigate } from 'react-router-dom';
import { useMe } from '../api/get-me';
import { useLogout } from '../api/logout';

/** Who is signed in, with a sign-out button; a sign-in link when nobody is. */
export function UserBadge() {
  const me = useMe();
  const navigate = useNavigate();
  const logout = useLogout(() => navigate('/sign-in'));
  if (me.isPending) return null;
  if (!me.data)
    return (
      <Link to="/sign-in" className="rounded px-3 py-1.5 text-sm text-paper/90 hover:bg-white/10">
        Sign in
      </Link>
    );
  return (
    <div className="flex items-center gap-3 text-sm">
      <Link to="/account" data-testid="signed-in-as" title="Your account and runner tokens" className="rounded px-2 py-1 hover:bg-white/10">
        <span className="text-paper">{me.data.name}</span> <span className="text-paper/60">· {me.data.role}</span>
      </Link>
      <button
        type="button"
        disabled={logout.isPending}
        onClick={() => logout.mutate()}
        className="rounded border border-paper/30 px-3 py-1 text-paper/90 hover:bg-white/10"
      >
        Sign out
      </button>
    </div>
  );
}
