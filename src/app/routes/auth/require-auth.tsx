import { Navigate, Outlet, useLocation } from 'react-router';
import { useMe } from '@/features/auth/api/get-me';
import { useSignOut } from '@/features/auth/api/sign-out';
import { Loading } from '@/components/ui/card';
import { AppShell } from '@/components/layouts/app-shell';
import { ErrorView } from '@/components/errors/error-view';
import { navItems } from '@/config/nav';
import type { Role } from '@shared/schemas/common';
import { UnitToggle } from '@/features/auth/components/unit-toggle';

/** Signed-in area: anyone without a session goes to sign-in and comes back afterwards. */
export function RequireAuth() {
  const me = useMe();
  const location = useLocation();
  const signOut = useSignOut();
  if (me.isPending) return <Loading />;
  if (me.isError) return <ErrorView title="Cannot reach Stripwarden" message={me.error.message} />;
  if (!me.data) return <Navigate to={`/sign-in?next=${encodeURIComponent(location.pathname + location.search)}`} replace />;
  return <AppShell user={me.data} nav={navItems} onSignOut={() => signOut.mutateAsync()} extra={<UnitToggle />} />;
}

export function NotAllowed() {
  return (
    <ErrorView
      title="Not allowed"
      message="Your role does not give access to this page. Ask an admin if you need it."
    />
  );
}

/** A page for some roles only: others see a plain "not allowed". */
export function RequireRole({ roles }: { roles: readonly Role[] }) {
  const me = useMe();
  if (!me.data) return null;
  return roles.includes(me.data.role) ? <Outlet /> : <NotAllowed />;
}
