import { Link } from 'react-router';
import { useMe } from '@/features/auth/api/get-me';
import { useEvents } from '@/features/plan/api/get-events';
import { useCreateEvent } from '@/features/plan/api/create-event';
import { usePlanningPeople } from '@/features/plan/api/get-planning-people';
import { EventForm } from '@/features/plan/components/event-form';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { paths } from '@/config/paths';
import { useDates } from '@/lib/date-format';

export default function EventsPage() {
  const me = useMe();
  const events = useEvents();
  const { calendarRange: dateRange } = useDates();
  const isDirector = me.data?.role === 'director';
  const people = usePlanningPeople(isDirector);
  const create = useCreateEvent();
  return (
    <>
      <PageHeader title="Events" subtitle="Competitions and their venues." />
      <div className={`grid gap-6 ${isDirector ? 'lg:grid-cols-[2fr_1fr]' : ''}`}>
        <div className="flex flex-col gap-4">
          {events.isPending && <Loading />}
          {events.isError && <Notice tone="error">{events.error.message}</Notice>}
          {events.data?.length === 0 && (
            <Card>
              <p className="text-ink-soft">No events yet.</p>
            </Card>
          )}
          {events.data?.map((e) => (
            <Card key={e.id}>
              <div className="flex flex-wrap items-baseline justify-between gap-2">
                <Link to={paths.event(e.id)} className="text-lg font-semibold text-brand underline">
                  {e.name}
                </Link>
                <span className="text-sm text-ink-soft">{dateRange(e.startsOn, e.endsOn)}</span>
              </div>
              <ul className="mt-2 flex flex-wrap gap-2 text-sm">
                {e.venues.length === 0 && <li className="text-ink-soft">No venues yet.</li>}
                {e.venues.map((v) => (
                  <li key={v.id}>
                    <Link
                      className="inline-flex min-h-touch items-center rounded-lg border border-line px-3 hover:bg-brand-soft"
                      to={isDirector ? paths.venuePlan(v.id) : paths.venue(v.id)}
                    >
                      {v.name}
                    </Link>
                  </li>
                ))}
              </ul>
            </Card>
          ))}
        </div>
        {isDirector && (
          <Card className="self-start">
            <h2 className="mb-3 text-lg font-semibold">New event</h2>
            <EventForm organisers={people.data?.organisers ?? []} onCreate={(v) => create.mutateAsync(v)} />
          </Card>
        )}
      </div>
    </>
  );
}
