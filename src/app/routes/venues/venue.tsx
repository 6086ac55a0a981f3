import { Link, useNavigate, useParams } from 'react-router';
import { useMe } from '@/features/auth/api/get-me';
import { useBoard } from '@/features/board/api/get-board';
import { usePrefetchStrips } from '@/features/testing/api/get-strip';
import { StripFilters, StripGrid, useStripFilters } from '@/features/board/components/strip-grid';
import { StripPicker } from '@/features/board/components/strip-picker';
import { OpenFaultsList } from '@/features/board/components/open-faults';
import { VENUE_STATUS_LABELS } from '@/features/board/utils/strip-status';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { ProgressBar } from '@/components/ui/status-mark';
import { paths } from '@/config/paths';
import { venueLabelsUrl } from '@/features/labels/api/label-sheets';

const linkClass = 'inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium hover:bg-paper';

/** A venue: pick a strip by tapping it or typing its number, and reach the venue's other pages. */
export default function VenuePage() {
  const { venueId = '' } = useParams();
  const navigate = useNavigate();
  const me = useMe();
  const board = useBoard(venueId);
  const filters = useStripFilters(board.data?.strips ?? []);
  // Those who test get every strip of the venue onto the tablet while the network is there.
  const tests = me.data?.role === 'technician' || me.data?.role === 'director';
  usePrefetchStrips(board.data?.strips.map((s) => s.id) ?? [], tests);
  if (board.isPending) return <Loading />;
  if (board.isError && !board.data) return <Notice tone="error">{board.error.message}</Notice>;
  const { venue, counts, progress, openFaults } = board.data;
  const role = me.data?.role;

  return (
    <>
      <PageHeader
        title={venue.name}
        subtitle={`${venue.eventName} · ${VENUE_STATUS_LABELS[venue.status] ?? venue.status}`}
        actions={
          <nav aria-label="Venue pages" className="flex flex-wrap gap-2">
            <Link to={paths.venueBoard(venue.id)} className={linkClass}>
              Status board
            </Link>
            {role === 'director' && (
              <Link to={paths.venuePlan(venue.id)} className={linkClass}>
                Plan
              </Link>
            )}
            {/* Labels for the strips and their items: those who plan, keep the register or test here. */}
            {role !== 'organiser' && (
              <a href={venueLabelsUrl(venue.id)} target="_blank" rel="noreferrer" className={linkClass}>
                Print labels
              </a>
            )}
            <Link to={paths.venueSpares(venue.id)} className={linkClass}>
              Spares
            </Link>
            {(venue.status === 'signed-off' || counts['out-of-service'] > 0) && (
              <Link to={paths.venueIncidents(venue.id)} className={linkClass}>
                Incidents
              </Link>
            )}
            {role !== 'technician' && (
              <>
                <Link to={paths.venueReadings(venue.id)} className={linkClass}>
                  Readings
                </Link>
                <Link to={paths.venueAudit(venue.id)} className={linkClass}>
                  Audit trail
                </Link>
                {/* Signing off is the director's; an organiser is told by e-mail and reads the certificates. */}
                {role !== 'organiser' && (
                  <Link to={paths.venueSignOff(venue.id)} className={linkClass}>
                    Sign-off
                  </Link>
                )}
                <Link to={paths.venueCertificates(venue.id)} className={linkClass}>
                  Certificates
                </Link>
              </>
            )}
          </nav>
        }
      />
      <Card className="mb-4 grid gap-4 md:grid-cols-2 md:items-center">
        <ProgressBar done={progress.stepsDone} total={progress.stepsTotal} label="Steps measured in this venue" />
        {tests && <StripPicker strips={board.data.strips} onPick={(s) => navigate(paths.stripTest(s.id))} />}
      </Card>
      <div className="mb-4">
        <StripFilters filters={filters} counts={counts} />
      </div>
      {/* Only those who test open a strip's testing screen. */}
      <StripGrid strips={filters.shown} linkTo={tests ? (s) => paths.stripTest(s.id) : undefined} />
      <Card className="mt-6">
        <h2 className="mb-2 text-lg font-semibold">Open faults</h2>
        <OpenFaultsList faults={openFaults} unitSystem={me.data?.unitSystem ?? 'metric'} />
      </Card>
    </>
  );
}
