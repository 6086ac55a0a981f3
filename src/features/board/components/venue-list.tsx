import type { ReactNode } from 'react';
import { Link } from 'react-router';
import { Card, Loading, Notice } from '@/components/ui/card';
import { ProgressBar, StatusMark } from '@/components/ui/status-mark';
import { paths } from '@/config/paths';
import { useVenues } from '../api/get-venues';
import { STRIP_STATUSES, stripStatusLook, VENUE_STATUS_LABELS } from '../utils/strip-status';
import { useDates } from '@/lib/date-format';

/** The venues the signed-in person may see, with how far testing has got. */
/** `actions` lets a page add links of other features (sign-off, certificates) to each card. */
export function VenueList({ actions }: { actions?: (venue: { id: string; status: string }) => ReactNode } = {}) {
  const venues = useVenues();
  const dates = useDates();
  if (venues.isPending) return <Loading />;
  if (venues.isError && !venues.data) return <Notice tone="error">{venues.error.message}</Notice>;
  if (venues.data.length === 0) {
    return (
      <Card>
        <p className="text-ink-soft">No venues yet. A technical director plans them; technicians see the venues they are assigned to.</p>
      </Card>
    );
  }
  return (
    <ul className="grid gap-4 md:grid-cols-2">
      {venues.data.map((v) => (
        <li key={v.id}>
          <Card className="flex h-full flex-col gap-3">
            <div className="flex items-start justify-between gap-3">
              <div>
                <h2 className="text-lg font-semibold">
                  <Link to={paths.venue(v.id)} className="underline-offset-4 hover:underline">
                    {v.name}
                  </Link>
                </h2>
                <p className="text-sm text-ink-soft">
                  {v.eventName} · {dates.calendarRange(v.startsOn, v.endsOn)} · {v.stripCount} strips
                </p>
              </div>
              <span className="rounded-md bg-brand-soft px-2 py-1 text-xs font-semibold text-brand">
                {VENUE_STATUS_LABELS[v.status] ?? v.status}
              </span>
            </div>
            <ProgressBar done={v.stepsDone} total={v.stepsTotal} label="Steps measured" />
            <ul className="flex flex-wrap gap-2" aria-label={`Strips of ${v.name} by status`}>
              {STRIP_STATUSES.filter((s) => v.byStatus[s] > 0).map((s) => (
                <li key={s}>
                  <StatusMark {...stripStatusLook[s]} label={`${v.byStatus[s]} ${stripStatusLook[s].label.toLowerCase()}`} size="sm" />
                </li>
              ))}
            </ul>
            <div className="mt-auto flex flex-wrap gap-2">
              <Link to={paths.venue(v.id)} className="inline-flex min-h-touch items-center rounded-lg bg-brand px-4 font-medium text-white">
                Open venue
              </Link>
              <Link
                to={paths.venueBoard(v.id)}
                className="inline-flex min-h-touch items-center rounded-lg border border-line px-4 font-medium"
              >
                Status board
              </Link>
              {actions?.(v)}
            </div>
          </Card>
        </li>
      ))}
    </ul>
  );
}
