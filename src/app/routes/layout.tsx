import { useQuery, useQueryClient } from '@tanstack/react-query';
import { NavLink, Outlet, useNavigate } from 'react-router';
import { ROLE_LABELS, type Role } from '#shared/api/roles';
import { forgetMe, meQuery, signOut } from '../../features/auth/api';

interface NavItem { to: string; label: string; roles: Role[] }
const NAV: NavItem[] = [
  { to: '/board', label: 'Board', roles: ['qc_manager', 'engineer', 'admin'] },
  { to: '/review', label: 'Review', roles: ['qc_manager', 'engineer', 'admin'] },
  { to: '/yard', label: 'Yard', roles: ['inspector', 'qc_manager', 'engineer', 'admin'] },
  { to: '/', label: 'Pieces', roles: ['inspector', 'qc_manager', 'engineer', 'admin', 'viewer'] },
  { to: '/bays', label: 'Bays', roles: ['qc_manager', 'engineer', 'admin', 'viewer'] },
  { to: '/shipping', label: 'Shipping', roles: ['qc_manager', 'engineer', 'admin'] },
  { to: '/tags', label: 'Tags', roles: ['qc_manager', 'engineer', 'admin'] },
  { to: '/designs', label: 'Designs', roles: ['engineer', 'admin'] },
  { to: '/imports', label: 'Imports', roles: ['engineer', 'admin'] },
  { to: '/calibration', label: 'Calibration', roles: ['qc_manager', 'engineer', 'admin'] },
  { to: '/settings', label: 'Settings', roles: ['qc_manager', 'engineer', 'admin'] },
  { to: '/admin/users', label: 'Users', roles: ['admin'] },
  { to: '/admin/jobs', label: 'Jobs', roles: ['admin', 'engineer'] },
];

export function Layout() {
  const { data: me } = useQuery(meQuery);
  const qc = useQueryClient();
  const navigate = useNavigate();
  if (!me) return null;
  const out = async () => {
    await signOut().catch(() => undefined);
    forgetMe();
    qc.clear();
    navigate('/login');
  };
  return (
    <div className="min-h-screen">
      <header className="bg-concrete-800 text-white">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-4 px-4 py-2">
          <span className="text-lg font-semibold tracking-wide">
            <span aria-hidden="true">⌒</span> Crownwatch
          </span>
          <nav aria-label="Main" className="flex gap-1">
            {NAV.filter((n) => n.roles.includes(me.role)).map((n) => (
              <NavLink key={n.to} to={n.to} end className={({ isActive }) => `rounded px-3 py-2 font-semibold ${isActive ? 'bg-concrete-600' : 'hover:bg-concrete-700'}`}>
                {n.label}
              </NavLink>
            ))}
          </nav>
          <div className="ml-auto flex items-center gap-3 text-sm">
            <span>
              {me.name} · {ROLE_LABELS[me.role]} · {me.plantName}
            </span>
            <button type="button" className="btn border border-concrete-400 text-white hover:bg-concrete-700" onClick={out}>
              Sign out
            </button>
          </div>
        </div>
      </header>
      <main className="mx-auto max-w-6xl px-4 py-6">
        <Outlet />
      </main>
    </div>
  );
}
