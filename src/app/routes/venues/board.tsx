import { useState } from 'react';
import { Link, useParams } from 'react-router';
import { useMe } from '@/features/auth/api/get-me';
import { BOARD_REFRESH_MS, useBoard, type BoardStrip } from '@/features/board/api/get-board';
import { StripFilters, StripGrid, useStripFilters } from '@/features/board/components/strip-grid';
import { OpenFaultsList } from '@/features/board/components/open-faults';
import { STRIP_STATUSES, stripStatusLook, VENUE_STATUS_LABELS } from '@/features/board/utils/strip-status';
import { useStrip } from '@/features/testing/api/get-strip';
import { OpenIncidentPanel } from '@/features/incidents/components/open-incident-panel';
import { enqueueIncident } from '@/features/offline/stores/outbox';
import { newReadingId } from '@/features/offline/utils/reading-id';
import { QueuedIncidentMark } from '@/features/offline/components/queued-incident-mark';
import { useOutbox } from '@/features/offline/hooks/use-outbox';
import { Button } from '@/components/ui/button';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { MarkIcon, ProgressBar } from '@/components/ui/status-mark';
import { paths } from '@/config/paths';
import { useDates } from '@/lib/date-format';

const linkClass = 'inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium';

/** The strip's items for the incident panel, from the copy the tablet keeps (the board has none). */
function IncidentPanelFor({ strip, venueId, onDone }: { strip: BoardStrip; venueId: string; onDone: (label: string) => void }) {
  const detail = useStrip(strip.id);
  const me = useMe();
  return (
    <OpenIncidentPanel
      strip={{ id: strip.id, label: strip.label, positions: detail.data?.positions.map((p) => ({ id: p.id, name: p.name })) ?? [] }}
      onOpen={async (input) => {
        if (!me.data) throw new Error('Sign in again to open an incident.');
        // Kept on the tablet first, like a reading: it reaches the server once, whenever it can.
        await enqueueIncident({
          body: { ...input, clientId: newReadingId() },
          userId: me.data.id,
          venueId,
          where: `${strip.label} · ${input.symptom}`,
        });
        onDone(strip.label);
      }}
      onClose={() => onDone('')}
    />
  );
}

/** Every strip of a venue at a glance; it polls, so it follows the technicians without a reload. */
export default function BoardPage() {
  const { venueId = '' } = useParams();
  const me = useMe();
  const board = useBoard(venueId);
  const dates = useDates();
  const outbox = useOutbox();
  const filters = useStripFilters(board.data?.strips ?? []);
  const [reporting, setReporting] = useState<BoardStrip | null>(null);
  const [opened, setOpened] = useState('');
  if (board.isPending) return <Loading />;
  if (board.isError && !board.data) return <Notice tone="error">{board.error.message}</Notice>;
  const { venue, counts, progress, openFaults, generatedAt } = board.data;
  const canTest = me.data?.role === 'technician' || me.data?.role === 'director';
  // Incidents belong to the competition days, once the venue is signed off.
  const competing = venue.status === 'signed-off' || counts['out-of-service'] > 0;
  const statuses = STRIP_STATUSES.filter((s) => s !== 'out-of-service' || competing);
  const queuedFor = (s: BoardStrip) =>
    outbox.incidents.filter((i) => i.stripId === s.id && i.userId === me.data?.id && i.status !== 'set-aside');

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
          <>
            {competing && (
              <Link to={paths.venueIncidents(venue.id)} className={linkClass}>
                Incidents
              </Link>
            )}
            <Link to={paths.venue(venue.id)} className={linkClass}>
              Venue page
            </Link>
          </>
        }
      />
      {opened && (
        <div className="mb-4">
          <Notice tone="success">Incident opened on {opened}: it is out of service until it is resolved and amended.</Notice>
        </div>
      )}
      {reporting && (
        <div className="mb-4">
          <IncidentPanelFor
            key={reporting.id}
            strip={reporting}
            venueId={venue.id}
            onDone={(label) => {
              setReporting(null);
              setOpened(label);
            }}
          />
        </div>
      )}
      <div className="mb-4 grid grid-cols-4 gap-3 lg:grid-cols-7">
        {statuses.map((s) => (
          <Card
            key={s}
            className={`flex items-center gap-3 p-3 ${s === 'out-of-service' && counts[s] > 0 ? 'border-fail' : ''}`}
            data-count={s}
          >
            <MarkIcon shape={stripStatusLook[s].shape} tone={stripStatusLook[s].tone} className="size-7" />
            <div>
              <div className="text-2xl font-semibold tabular-nums">{counts[s]}</div>
              <div className="text-xs text-ink-soft">{stripStatusLook[s].label}</div>
            </div>
          </Card>
        ))}
        <Card className="flex flex-col justify-center p-3">
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
          <StripGrid
            strips={filters.shown}
            compact
            linkTo={canTest ? (s) => paths.stripTest(s.id) : undefined}
            actions={
              canTest && competing
                ? (s) => {
                    const queued = queuedFor(s);
                    if (queued.length > 0) return <QueuedIncidentMark item={queued[0]} />;
                    if (s.openIncidents > 0 || s.status === 'withdrawn') return null;
                    return (
                      <Button
                        variant="secondary"
                        className="min-h-14! border-fail/50 px-2 text-sm whitespace-nowrap text-fail"
                        onClick={() => setReporting(s)}
                        aria-label={`Report a problem on ${s.label}`}
                      >
                        Report a problem
                      </Button>
                    );
                  }
                : undefined
            }
          />
        </section>
        <Card className="self-start">
          <h2 className="mb-2 text-lg font-semibold">Open faults ({openFaults.length})</h2>
          <OpenFaultsList faults={openFaults} unitSystem={me.data?.unitSystem ?? 'metric'} />
        </Card>
      </div>
    </>
  );
}
