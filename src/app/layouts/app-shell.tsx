import { NavLink, Outlet, useNavigate } from 'react-router-dom';
import { toast } from 'sonner';
import { ROLE_LABELS, type UserDto } from '../../../shared/schemas/auth.schema';
import { useSignOut } from '../../features/auth/api/sign-in';
import { navFor } from '../nav';

export function AppShell({ user }: { user: UserDto }) {
  const items = navFor(user.roles);
  const signOut = useSignOut();
  const navigate = useNavigate();
  const link = ({ isActive }: { isActive: boolean }) =>
    `block rounded px-3 py-1.5 text-sm ${isActive ? 'bg-ink-800 text-white' : 'text-ink-300 hover:bg-ink-800/60 hover:text-white'}`;
  return (
    <div className="flex min-h-screen">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:bg-white focus:px-2">
        Skip to content
      </a>
      <aside className="flex w-56 shrink-0 flex-col bg-ink-900 px-3 py-4 text-ink-100">
        <div className="mb-6 flex items-center gap-2 px-2">
          <img src="/favicon.svg" alt="" className="h-7 w-7" />
          <span className="text-lg font-semibold tracking-tight">Placewright</span>
        </div>
        <nav aria-label="Main" className="flex flex-1 flex-col gap-4">
          <ul className="flex flex-col gap-0.5">
            {items.filter((i) => i.section === 'work').map((i) => (
              <li key={i.to}>
                <NavLink to={i.to} end={i.to === '/'} className={link}>
                  {i.label}
                </NavLink>
              </li>
            ))}
          </ul>
          {items.some((i) => i.section === 'admin') && (
            <div>
              <p className="px-3 pb-1 text-2xs font-medium uppercase tracking-wider text-ink-500">Administration</p>
              <ul className="flex flex-col gap-0.5">
                {items.filter((i) => i.section === 'admin').map((i) => (
                  <li key={i.to}>
                    <NavLink to={i.to} className={link}>
                      {i.label}
                    </NavLink>
                  </li>
                ))}
              </ul>
            </div>
          )}
        </nav>
        <div className="mt-4 border-t border-ink-800 px-2 pt-3 text-xs">
          <p className="font-medium text-ink-100">{user.name}</p>
          <p className="text-ink-400">{user.roles.map((r) => ROLE_LABELS[r]).join(' · ')}</p>
          <button
            type="button"
            className="mt-2 text-copper-300 hover:text-copper-200"
            onClick={() =>
              signOut.mutate(undefined, {
                onSuccess: () => navigate('/sign-in'),
                onError: (e) => toast.error(e.message),
              })
            }
          >
            Sign out
          </button>
        </div>
      </aside>
      <main id="main" className="min-w-0 flex-1 px-8 py-6">
        <Outlet />
      </main>
    </div>
  );
}
