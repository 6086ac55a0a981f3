import { useEffect } from 'react';
import { Navigate, Outlet, useLocation } from 'react-router';
import { useMe } from '@/features/auth/api/get-me';
import { useSignOut } from '@/features/auth/api/sign-out';
import { Loading } from '@/components/ui/card';
import { AppShell } from '@/components/layouts/app-shell';
import { ErrorView } from '@/components/errors/error-view';
import { navItems } from '@/config/nav';
import type { Role } from '@shared/schemas/common';
import { UnitToggle } from '@/features/auth/components/unit-toggle';
import { SyncIndicator } from '@/features/offline/components/sync-indicator';
import { setOutboxUser } from '@/features/offline/stores/outbox';

/** Signed-in area: anyone without a session goes to sign-in and comes back afterwards. */
export function RequireAuth() {
  const me = useMe();
  const location = useLocation();
  const signOut = useSignOut();
  const userId = me.data?.id ?? null;
  // The tablet's outbox sends the signed-in person's own readings only.
  useEffect(() => setOutboxUser(userId), [userId]);
  if (me.isPending && me.fetchStatus === 'paused') {
    return (
      <ErrorView
        title="No network"
        message="This tablet is offline and nobody has signed in on it yet. Sign in once with a network; after that testing works offline."
      />
    );
  }
  if (me.isPending) return <Loading />;
  // No answer from the server is not a sign-out: the user kept on the tablet stays signed in.
  if (me.isError && !me.data) return <ErrorView title="Cannot reach Stripwarden" message={me.error.message} />;
  if (!me.data) return <Navigate to={`/sign-in?next=${encodeURIComponent(location.pathname + location.search)}`} replace />;
  return (
    <AppShell
      user={me.data}
      nav={navItems}
      onSignOut={() => signOut.mutateAsync()}
      extra={
        <>
          <SyncIndicator />
          <UnitToggle />
        </>
      }
    />
  );
}

export function NotAllowed() {
  return <ErrorView title="Not allowed" message="Your role does not give access to this page. Ask an admin if you need it." />;
}

/** A page for some roles only: others see a plain "not allowed". */
export function RequireRole({ roles }: { roles: readonly Role[] }) {
  const me = useMe();
  if (!me.data) return null;
  return roles.includes(me.data.role) ? <Outlet /> : <NotAllowed />;
}
