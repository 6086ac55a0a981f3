import { Link, useParams } from 'react-router';
import { useMe } from '@/features/auth/api/get-me';
import { BOARD_REFRESH_MS, useBoard } from '@/features/board/api/get-board';
import { StripFilters, StripGrid, useStripFilters } from '@/features/board/components/strip-grid';
import { OpenFaultsList } from '@/features/board/components/open-faults';
import { STRIP_STATUSES, stripStatusLook, VENUE_STATUS_LABELS } from '@/features/board/utils/strip-status';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { MarkIcon, ProgressBar } from '@/components/ui/status-mark';
import { paths } from '@/config/paths';
import { useDates } from '@/lib/date-format';

/** Every strip of a venue at a glance; it polls, so it follows the technicians without a reload. */
export default function BoardPage() {
  const { venueId = '' } = useParams();
  const me = useMe();
  const board = useBoard(venueId);
  const dates = useDates();
  const filters = useStripFilters(board.data?.strips ?? []);
  if (board.isPending) return <Loading />;
  if (board.isError && !board.data) return <Notice tone="error">{board.error.message}</Notice>;
  const { venue, counts, progress, openFaults, generatedAt } = board.data;
  const canTest = me.data?.role === 'technician' || me.data?.role === 'director';

  return (
    <>
      <PageHeader
        title={`${venue.name} — status board`}
        subtitle={
          <>
            {venue.eventName} · {VENUE_STATUS_LABELS[venue.status] ?? venue.status} · updated{' '}
            <time dateTime={generatedAt}>{dates.time(generatedAt)}</time>, refreshes every {BOARD_REFRESH_MS / 1000} s
            {board.isRefetchError ? ' · cannot reach the server, showing the last answer' : ''}
          </>
        }
        actions={
          <Link to={paths.venue(venue.id)} className="inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium">
            Venue page
          </Link>
        }
      />
      <div className="mb-4 grid grid-cols-2 gap-3 md:grid-cols-6">
        {STRIP_STATUSES.map((s) => (
          <Card key={s} className="flex items-center gap-3 p-3" data-count={s}>
            <MarkIcon shape={stripStatusLook[s].shape} tone={stripStatusLook[s].tone} className="size-7" />
            <div>
              <div className="text-2xl font-semibold tabular-nums">{counts[s]}</div>
              <div className="text-xs text-ink-soft">{stripStatusLook[s].label}</div>
            </div>
          </Card>
        ))}
        <Card className="col-span-2 flex flex-col justify-center p-3 md:col-span-1">
          <div className="text-2xl font-semibold tabular-nums" data-testid="board-percent">
            {progress.percent} %
          </div>
          <div className="text-xs text-ink-soft">of steps measured</div>
        </Card>
      </div>
      <Card className="mb-4">
        <ProgressBar done={progress.stepsDone} total={progress.stepsTotal} label="Steps measured" />
      </Card>
      <div className="grid gap-4 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <section aria-label="Strips">
          <div className="mb-3">
            <StripFilters filters={filters} counts={counts} />
          </div>
          <StripGrid strips={filters.shown} compact linkTo={canTest ? (s) => paths.stripTest(s.id) : undefined} />
        </section>
        <Card className="self-start">
          <h2 className="mb-2 text-lg font-semibold">Open faults ({openFaults.length})</h2>
          <OpenFaultsList faults={openFaults} unitSystem={me.data?.unitSystem ?? 'metric'} />
        </Card>
      </div>
    </>
  );
}
