import type { ComponentType } from 'react';
import { Link } from 'react-router';
import type { Role } from '@shared/schemas/common';
import { Card } from '@/components/ui/card';
import { paths } from '@/config/paths';
import { VenueList } from '@/features/venue-status/components/venue-list';

function AdminHome() {
  return (
    <div className="grid gap-4 sm:grid-cols-2">
      <Card>
        <h2 className="text-lg font-semibold">People</h2>
        <p className="mt-1 text-sm text-ink-soft">Invite people, change roles, disable accounts.</p>
        <Link className="mt-3 inline-flex min-h-touch items-center font-medium text-brand underline" to={paths.people}>
          Open people
        </Link>
      </Card>
      <Card>
        <h2 className="text-lg font-semibold">Outbox</h2>
        <p className="mt-1 text-sm text-ink-soft">Messages the app has sent (kept locally in demo and test set-ups).</p>
        <Link className="mt-3 inline-flex min-h-touch items-center font-medium text-brand underline" to={paths.outbox}>
          Open outbox
        </Link>
      </Card>
    </div>
  );
}

function VenuesHome() {
  return <VenueList />;
}

export const homeSections: Record<Role, ComponentType> = {
  admin: AdminHome,
  director: VenuesHome,
  organiser: VenuesHome,
  technician: VenuesHome,
};
