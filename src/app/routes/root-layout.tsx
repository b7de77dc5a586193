import { NavLink, Outlet } from 'react-router-dom';
import { BrandMark } from '../../components/brand-mark';
import { useMe, type Role } from '../../features/auth/api/get-me';
import { UserBadge } from '../../features/auth/components/user-badge';

/** `hideFor`: roles the page is not for, so the link is left out rather than shown dead. */
const nav: Array<{ to: string; label: string; end: boolean; hideFor?: Role[] }> = [
  { to: '/', label: 'Overview', end: true },
  { to: '/bench', label: 'Bench', end: false, hideFor: ['reviewer'] },
  { to: '/sessions', label: 'Sessions', end: false },
  { to: '/compare', label: 'Compare', end: false },
  { to: '/conditions', label: 'Conditions', end: false },
  { to: '/builds', label: 'Builds', end: false },
  { to: '/cores', label: 'Cores', end: false },
  { to: '/boards', label: 'Boards', end: false },
  { to: '/team', label: 'Team', end: false, hideFor: ['engineer', 'reviewer'] },
];

export function RootLayout() {
  const role = useMe().data?.role;
  return (
    <div className="min-h-screen flex flex-col">
      <header className="bg-ink text-paper print:hidden">
        <div className="mx-auto max-w-screen-2xl flex items-center gap-8 px-6 h-14">
          <NavLink to="/" className="flex items-center gap-2 font-bold tracking-wide text-lg">
            <BrandMark className="h-7 w-7" />
            Anglebench
          </NavLink>
          <nav aria-label="Main" className="flex gap-1">
            {nav.filter((item) => !(role && item.hideFor?.includes(role))).map((item) => (
              <NavLink
                key={item.to}
                to={item.to}
                end={item.end}
                className={({ isActive }) =>
                  `px-3 py-1.5 rounded text-sm ${isActive ? 'bg-signal text-ink font-bold' : 'text-paper/80 hover:text-paper hover:bg-white/10'}`
                }
              >
                {item.label}
              </NavLink>
            ))}
          </nav>
          <div className="ml-auto">
            <UserBadge />
          </div>
        </div>
      </header>
      <main className="flex-1 mx-auto w-full max-w-screen-2xl px-6 py-6">
        <Outlet />
      </main>
    </div>
  );
}
