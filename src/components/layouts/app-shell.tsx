import { NavLink, Outlet, useNavigate } from 'react-router';
import type { ReactNode } from 'react';
import { ROLE_LABELS, type Role } from '@shared/schemas/common';

export interface NavItem {
  to: string;
  label: string;
  roles?: readonly Role[];
}

export function AppShell({
  user,
  nav,
  onSignOut,
  extra,
}: {
  user: { name: string; role: Role };
  nav: NavItem[];
  onSignOut: () => Promise<unknown>;
  extra?: ReactNode;
}) {
  const navigate = useNavigate();
  const items = nav.filter((n) => !n.roles || n.roles.includes(user.role));
  return (
    <div className="min-h-screen">
      <header className="bg-brand text-white">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-4 gap-y-2 px-4 py-2">
          <NavLink to="/" className="flex min-h-touch items-center gap-2 text-lg font-semibold tracking-wide">
            <svg aria-hidden viewBox="0 0 32 32" className="size-7">
              <rect width="32" height="32" rx="6" fill="#f2b33d" />
              <path d="M6 22h20M9 10l14 12M23 10 9 22" stroke="#0f3d3e" strokeWidth="2.5" strokeLinecap="round" />
            </svg>
            Stripwarden
          </NavLink>
          <nav aria-label="Main" className="order-last -mx-1 flex w-full gap-1 overflow-x-auto md:order-none md:mx-0 md:w-auto md:flex-1 md:flex-wrap">
            {items.map((n) => (
              <NavLink
                key={n.to}
                to={n.to}
                end={n.to === '/'}
                className={({ isActive }) =>
                  `flex min-h-touch shrink-0 items-center rounded-md px-3 text-sm font-medium whitespace-nowrap ${isActive ? 'bg-white/15' : 'hover:bg-white/10'}`
                }
              >
                {n.label}
              </NavLink>
            ))}
          </nav>
          <div className="ml-auto flex items-center gap-3 text-sm">
            {extra}
            <span className="hidden sm:inline" title={ROLE_LABELS[user.role]}>
              {user.name}
              <span className="hidden text-white/75 2xl:inline"> · {ROLE_LABELS[user.role]}</span>
            </span>
            <button
              type="button"
              className="min-h-touch rounded-md px-3 font-medium hover:bg-white/10"
              onClick={async () => {
                await onSignOut();
                navigate('/sign-in');
              }}
            >
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
