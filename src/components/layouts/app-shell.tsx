import { NavLink, Outlet, useNavigate } from 'react-router';
import { useId, useRef, useState, type ReactNode } from 'react';
import { ROLE_LABELS, type Role } from '@shared/schemas/common';

export interface NavItem {
  to: string;
  label: string;
  roles?: readonly Role[];
}

const linkClass = ({ isActive }: { isActive: boolean }) =>
  `flex min-h-touch shrink-0 items-center rounded-md px-3 text-sm font-medium whitespace-nowrap ${isActive ? 'bg-white/15' : 'hover:bg-white/10'}`;

/**
 * One header row at every width: below 1536 px the pages and the sign-out sit behind a Menu button
 * (the panel lies over the page, so the header never grows); from 1536 px they are inline, in a
 * header as wide as the window (an admin's links, the sync state and the length switch need some
 * 1 400 px side by side; in the page's 1 152 px they were cut off).
 */
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
  const menuId = useId();
  const [open, setOpen] = useState(false);
  const menuButton = useRef<HTMLButtonElement>(null);
  const items = nav.filter((n) => !n.roles || n.roles.includes(user.role));
  const signOut = async () => {
    await onSignOut();
    navigate('/sign-in');
  };
  const who = (
    <span title={ROLE_LABELS[user.role]}>
      {user.name}
      <span className="text-white/80"> · {ROLE_LABELS[user.role]}</span>
    </span>
  );
  return (
    <div className="min-h-screen">
      <header className="relative bg-brand text-white" data-testid="app-header">
        <div className="mx-auto flex max-w-6xl flex-nowrap items-center gap-x-3 px-4 py-2 2xl:max-w-none">
          <NavLink to="/" className="flex min-h-touch shrink-0 items-center gap-2 text-lg font-semibold tracking-wide">
            <svg aria-hidden viewBox="0 0 32 32" className="size-7">
              <rect width="32" height="32" rx="6" fill="#f2b33d" />
              <path d="M6 22h20M9 10l14 12M23 10 9 22" stroke="#0f3d3e" strokeWidth="2.5" strokeLinecap="round" />
            </svg>
            <span className="max-sm:sr-only">Stripwarden</span>
          </NavLink>
          <nav aria-label="Main" className="hidden min-w-0 flex-1 gap-1 overflow-x-auto 2xl:flex">
            {items.map((n) => (
              <NavLink key={n.to} to={n.to} end={n.to === '/'} className={linkClass}>
                {n.label}
              </NavLink>
            ))}
          </nav>
          <button
            ref={menuButton}
            type="button"
            className="flex min-h-touch items-center gap-2 rounded-md border border-white/40 px-3 text-sm font-semibold hover:bg-white/10 2xl:hidden"
            aria-expanded={open}
            aria-controls={menuId}
            onClick={() => setOpen(!open)}
          >
            <svg aria-hidden viewBox="0 0 20 20" className="size-5">
              <path d="M3 5h14M3 10h14M3 15h14" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
            </svg>
            Menu
          </button>
          <div className="ml-auto flex shrink-0 items-center gap-3 text-sm">
            {extra}
            <span className="hidden 2xl:inline">{who}</span>
            <button type="button" className="hidden min-h-touch rounded-md px-3 font-medium hover:bg-white/10 2xl:block" onClick={signOut}>
              Sign out
            </button>
          </div>
        </div>
        {open && (
          <div
            id={menuId}
            className="absolute inset-x-0 top-full z-30 border-t border-white/20 bg-brand shadow-lg 2xl:hidden"
            onKeyDown={(e) => {
              if (e.key === 'Escape') {
                setOpen(false);
                menuButton.current?.focus();
              }
            }}
          >
            <div className="mx-auto flex max-w-6xl flex-col gap-1 px-4 py-3">
              <nav aria-label="Main" className="grid gap-1 sm:grid-cols-3">
                {items.map((n) => (
                  <NavLink key={n.to} to={n.to} end={n.to === '/'} className={linkClass} onClick={() => setOpen(false)}>
                    {n.label}
                  </NavLink>
                ))}
              </nav>
              <div className="mt-2 flex items-center justify-between gap-3 border-t border-white/20 pt-2 text-sm">
                {who}
                <button type="button" className="min-h-touch rounded-md px-3 font-medium hover:bg-white/10" onClick={signOut}>
                  Sign out
                </button>
              </div>
            </div>
          </div>
        )}
      </header>
      <main className="mx-auto max-w-6xl px-4 py-6">
        <Outlet />
      </main>
    </div>
  );
}
