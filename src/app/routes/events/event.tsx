import { Link, useNavigate, useParams } from 'react-router';
import { useMe } from '@/features/auth/api/get-me';
import { useEvent } from '@/features/plan/api/get-event';
import { useEvents } from '@/features/plan/api/get-events';
import { useCreateVenue } from '@/features/plan/api/create-venue';
import { VenueForm } from '@/features/plan/components/venue-form';
import { useProfiles } from '@/features/profiles/api/get-profiles';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { paths } from '@/config/paths';
import { useDates } from '@/lib/date-format';

const linkClass = 'inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-3 text-sm font-medium hover:bg-brand-soft';

export default function EventPage() {
  const { eventId = '' } = useParams();
  const me = useMe();
  const navigate = useNavigate();
  const event = useEvent(eventId);
  const dates = useDates();
  const isDirector = me.data?.role === 'director';
  const profiles = useProfiles();
  const allEvents = useEvents();
  const createVenue = useCreateVenue();
  if (event.isPending) return <Loading />;
  if (event.isError) return <Notice tone="error">{event.error.message}</Notice>;
  const e = event.data;
  const cloneSources = (allEvents.data ?? []).flatMap((ev) => ev.venues.map((v) => ({ id: v.id, name: v.name, eventName: ev.name })));
  return (
    <>
      <PageHeader
        title={e.name}
        subtitle={`${dates.calendarRange(e.startsOn, e.endsOn)} · technical director ${e.directorName ?? '—'} · organiser ${e.organiserName ?? 'not chosen'}`}
      />
      <div className={`grid gap-6 ${isDirector ? 'lg:grid-cols-[2fr_1fr]' : ''}`}>
        <Card className="p-0!">
          <h2 className="border-b border-line px-5 py-3 text-lg font-semibold">Venues</h2>
          {e.venues.length === 0 && <p className="px-5 py-4 text-ink-soft">No venues yet.</p>}
          <ul className="divide-y divide-line">
            {e.venues.map((v) => (
              <li key={v.id} className="flex flex-wrap items-center gap-3 px-5 py-3">
                <span className="flex-1">
                  <span className="font-semibold">{v.name}</span>
                  <span className="ml-2 text-sm text-ink-soft">
                    {v.stripCount} strips · {v.status}
                  </span>
                </span>
                <Link className={linkClass} to={paths.venue(v.id)}>
                  Venue
                </Link>
                {isDirector && (
                  <Link className={linkClass} to={paths.venuePlan(v.id)}>
                    Plan
                  </Link>
                )}
                <Link className={linkClass} to={paths.venueReadings(v.id)}>
                  Readings
                </Link>
                {me.data?.role !== 'technician' && (
                  <Link className={linkClass} to={paths.venueAudit(v.id)}>
                    Audit trail
                  </Link>
                )}
              </li>
            ))}
          </ul>
        </Card>
        {isDirector && (
          <Card className="self-start">
            <h2 className="mb-3 text-lg font-semibold">Add a venue</h2>
            <VenueForm
              profiles={profiles.data ?? []}
              cloneSources={cloneSources}
              onCreate={async (v) => {
                const plan = await createVenue.mutateAsync({ ...v, eventId });
                navigate(paths.venuePlan(plan.venue.id));
              }}
            />
          </Card>
        )}
      </div>
    </>
  );
}
