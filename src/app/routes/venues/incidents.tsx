import { useMemo, useState } from 'react';
import { Link, useParams } from 'react-router';
import { useMe } from '@/features/auth/api/get-me';
import { incidentReportUrl, useVenueIncidents } from '@/features/incidents/api/get-venue-incidents';
import { useAmendVenue, type AmendmentResult } from '@/features/incidents/api/amend-venue';
import { AmendForm } from '@/features/incidents/components/amend-form';
import { IncidentsTable, incidentColumns } from '@/features/incidents/components/incidents-table';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { useDates } from '@/lib/date-format';
import { paths } from '@/config/paths';

const linkClass = 'inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium hover:bg-paper';

/** The competition days of a venue: every incident, the amendment for the resolved ones, the report. */
export default function IncidentsPage() {
  const { venueId = '' } = useParams();
  const me = useMe();
  const q = useVenueIncidents(venueId);
  const amend = useAmendVenue(venueId);
  const [amended, setAmended] = useState<AmendmentResult | null>(null);
  const dates = useDates();
  const columns = useMemo(() => incidentColumns(paths.stripTest, paths.verify, dates), [dates]);
  if (q.isPending) return <Loading />;
  if (q.isError) return <Notice tone="error">{q.error.message}</Notice>;
  const { venue, event, incidents, toAmend, canAmend } = q.data;
  const open = incidents.filter((i) => i.status === 'open').length;
  const amendable = incidents.filter((i) => toAmend.includes(i.id));
  const labelOf = (stripId: string) => incidents.find((i) => i.stripId === stripId)?.stripLabel ?? stripId;
  return (
    <>
      <PageHeader
        title={`Incidents: ${venue.name}`}
        subtitle={`${event.name} · ${open} open · ${incidents.length} in all`}
        actions={
          <>
            <a className={linkClass} href={incidentReportUrl(venueId)} download>
              Incident report (PDF)
            </a>
            <Link className={linkClass} to={paths.venueSpares(venueId)}>
              Spares
            </Link>
            <Link className={linkClass} to={paths.venueBoard(venueId)}>
              Status board
            </Link>
            {me.data?.role !== 'technician' && (
              <Link className={linkClass} to={paths.venueCertificates(venueId)}>
                Certificates
              </Link>
            )}
          </>
        }
      />
      {amended && (
        <div className="mb-6" data-testid="amended">
          <Card className="border-pass/50 bg-pass-soft">
            <h2 className="text-xl font-semibold text-pass">
              Amended. {amended.certificates.length} new strip certificate{amended.certificates.length === 1 ? '' : 's'}; the venue
              certificate stays valid.
            </h2>
            <ul className="mt-3 flex flex-col gap-1">
              {amended.certificates.map((c) => (
                <li key={c.number}>
                  {labelOf(c.stripId)}:{' '}
                  <Link className="font-mono font-semibold underline" to={paths.verify(c.number)}>
                    {c.number}
                  </Link>
                  {c.supersedes && (
                    <span className="text-sm text-ink-soft">
                      {' '}
                      (replaces <span className="font-mono">{c.supersedes}</span>)
                    </span>
                  )}
                </li>
              ))}
            </ul>
          </Card>
        </div>
      )}
      <div className={`grid gap-6 ${canAmend ? 'xl:grid-cols-[3fr_2fr]' : ''}`}>
        <Card className="overflow-x-auto p-0!">
          <IncidentsTable incidents={incidents} columns={columns} />
        </Card>
        {canAmend && (
          <Card className="self-start">
            <h2 className="mb-1 text-lg font-semibold">Amend the venue</h2>
            {amendable.length === 0 ? (
              <p className="text-sm text-ink-soft">
                Nothing to amend: an incident can be amended for once it is resolved (every required step of its strip passing after it
                opened).
              </p>
            ) : (
              <>
                <p className="mb-3 text-sm text-ink-soft">
                  Each strip chosen gets a new strip certificate; its old one is superseded. The venue stays signed off.
                </p>
                <AmendForm
                  key={amendable.map((i) => i.id).join(',')}
                  incidents={amendable}
                  onAmend={async (body) => setAmended(await amend.mutateAsync(body))}
                />
              </>
            )}
          </Card>
        )}
      </div>
    </>
  );
}
